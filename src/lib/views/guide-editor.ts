/*
 * The guide editor's working copy and choices, as the authoring services return them. Types only.
 */
import type { Finding, FindingCounts } from '$lib/domain/fit';
import type { PowerBudget } from '$lib/domain/power';
import type { AlternateReason, PartCategory } from '$lib/domain/types';
import type { BuildNotesInput, GuideDisclosure, GuideTag } from '$lib/schemas/guide-editor';
import type { PartRef } from './guide';
import type { GalleryItem } from './photos';

/** A part as the editor shows it: the same reference every page uses. */
export type DraftPartRef = PartRef;

export interface DraftSlotView {
	/** The slot's own key: send it back with the slot so it stays the same slot. */
	slotKey: string;
	category: PartCategory;
	label: string;
	quantity: number;
	pickPartId: number;
	pick: DraftPartRef;
	reason: string;
	priceQuote: { storeId: number; amount: string; observedAt: string } | null;
	alternates: { partId: number; part: DraftPartRef; reasonTag: AlternateReason; note: string }[];
}

/** A benchmark row as the editor shows it: FPS as decimal text ("143.5"), stored as tenths. */
export interface DraftFrameView {
	workload: string;
	resolution: string;
	preset: string;
	avgFps: string;
	low1Fps: string | null;
	notes: string;
}

export interface DraftThermalView {
	loadName: string;
	cpuTempC: number | null;
	gpuTempC: number | null;
	cpuUtilPct: number | null;
	gpuUtilPct: number | null;
}

/** The working copy as the editor and GET …/draft show it; `version` goes back with a save. */
export interface DraftView {
	slug: string;
	title: string;
	summary: string;
	targetBudget: string;
	currency: string;
	baseRegion: string;
	tags: GuideTag[];
	disclosure: GuideDisclosure;
	disclosureNote: string | null;
	walkthroughUrl: string | null;
	buildNotes: BuildNotesInput;
	buildNotesHtml: string;
	slots: DraftSlotView[];
	frames: DraftFrameView[];
	thermals: DraftThermalView[];
	/** The working revision's photo gallery in order (services/gallery.ts). */
	gallery: GalleryItem[];
	version: number;
	state: string;
	revisionNumber: number;
	/** 'draft' while editable; 'submitted' once frozen (the next save starts a new revision). */
	revisionState: 'draft' | 'submitted';
	submittedAt: string | null;
	publishedRevisionNumber: number | null;
}

export interface EditorCatalog {
	regions: { code: string; name: string; currency: string }[];
	stores: { id: number; name: string; regionCode: string }[];
	/**
	 * The parts the page names: the draft's picks and alternates (and a suggested alternate).
	 * Never the whole catalog; the pickers search it (GET /api/v1/parts, or a typed name).
	 */
	parts: DraftPartRef[];
}

/** The live fit report and power budget while editing (POST /api/v1/fit). */
export interface FitResult {
	findings: Finding[];
	summary: FindingCounts;
	power: PowerBudget;
}
