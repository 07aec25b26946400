/*
 * Guides, as the guide services return them and the guide pages, cards and browse show them.
 * Types only: components import them with `import type` (model instances never leave services).
 */
import type { Finding, FindingCounts, Severity } from '$lib/domain/fit';
import type { PowerBudget } from '$lib/domain/power';
import type { Reproducibility } from '$lib/domain/reproducibility';
import type { RevisionDiff } from '$lib/domain/revision-diff';
import type { ValueSummary } from '$lib/domain/value';
import type { AlternateReason, Money, PartCategory } from '$lib/domain/types';

export interface RegionSummary {
	code: string;
	name: string;
	currency: string;
	taxMode: 'inclusive' | 'exclusive';
	taxRateBp: number;
}

export interface GuideCard {
	slug: string;
	title: string;
	summary: string;
	authorName: string;
	targetBudget: Money;
	baseRegion: RegionSummary;
	tags: string[];
	featured: boolean;
	/** Sum of the picks' quoted prices × quantity; null when a pick has no price yet. */
	picksTotal: Money | null;
	/** Number of slots without a price (so the total is understood as partial). */
	unpricedSlots: number;
	publishedAt: string; // ISO 8601
}

export interface PriceLine {
	/** Price for one unit in the shown region's currency. */
	unit: Money;
	/** quoted: a store's price in this region; estimated: worked out from the base region's price. */
	status: 'quoted' | 'estimated';
	/** The quoting store; null for estimates. */
	storeName: string | null;
	/** quoted: the day the price was seen; estimated: the exchange rates' as-of date (null when none was needed). */
	observedAt: string | null;
	taxIncluded: boolean;
}

export interface PartRef {
	id: number;
	slug: string;
	brand: string;
	model: string;
	category: PartCategory;
}

export interface AlternateView {
	rank: number;
	part: PartRef;
	reasonTag: AlternateReason;
	note: string;
	price: PriceLine | null;
	/** Alternate unit price minus pick unit price; null when either is unpriced. */
	deltaFromPick: Money | null;
	/** The fit report with this alternate swapped in (absent on guide cards). */
	dropIn?: DropInView;
}

/** fits: no new caution or conflict; caution: fits but adds or raises a caution; no-fit: a conflict. */
export type DropInStatus = 'fits' | 'caution' | 'no-fit';

export interface DropInView {
	status: DropInStatus;
	/** Findings that are new or whose severity moved with the alternate in place. */
	changed: { severity: Severity; before: Severity | null; message: string }[];
	/** Findings of the picks that no longer apply. */
	gone: string[];
}

export interface SlotView {
	id: number;
	/** The slot's own key, the same in every revision that has the slot (labels may repeat). */
	slotKey: string;
	category: PartCategory;
	label: string;
	position: number;
	quantity: number;
	pick: PartRef;
	reason: string;
	price: PriceLine | null;
	/** unit × quantity */
	lineTotal: Money | null;
	alternates: AlternateView[];
}

export interface GuideDetail extends GuideCard {
	revisionNumber: number;
	slots: SlotView[];
	/** Min and max of the build total over each slot's pick and alternates. */
	totalRange: { min: Money; max: Money } | null;
}

/** A guide priced in a chosen region (the base region unless the reader picks another). */
export interface PricedGuide extends GuideDetail {
	/** The author's public page, /authors/[handle]; null when the account is gone or disabled. */
	authorHandle: string | null;
	/** The region the prices are shown in. */
	region: RegionSummary;
	/** The target budget in the shown region's currency (itself in the base region); null without a rate. */
	budgetInRegion: Money | null;
	/** Every region a reader can switch to. */
	regions: RegionSummary[];
	/** How the picks were priced in this region. */
	picks: { quoted: number; estimated: number; unpriced: number };
	/** Oldest exchange-rate date behind an estimate, and whether rates are older than 7 days. */
	ratesAsOf: string | null;
	ratesStale: boolean;
	/** Frame results against this region's picks total (null on the plain pricing of cards). */
	value?: ValueSummary;
	/** How copyable the guide is in this region, with its reasons and the age of each pick's newest quote. */
	reproducibility?: ReproducibilityView;
}

export interface ReproducibilityView extends Reproducibility {
	slots: { label: string; latestQuoteAt: string | null; hasDropInAlternate: boolean }[];
}

export interface FrameResultView {
	workload: string;
	resolution: string;
	preset: string;
	averageFps: number;
	low1Fps: number | null;
	notes: string;
}

export interface ThermalResultView {
	loadName: string;
	cpuTempC: number | null;
	gpuTempC: number | null;
	cpuUtilPct: number | null;
	gpuUtilPct: number | null;
}

export interface RevisionRef {
	number: number;
	publishedAt: string | null;
	submittedAt: string | null;
}

/** Everything the guide page shows besides the prices (none of it depends on the region). */
export interface GuidePageExtras {
	fit: { findings: Finding[]; summary: FindingCounts; slotLabels: Record<string, string> };
	power: PowerBudget;
	frames: FrameResultView[];
	thermals: ThermalResultView[];
	/** Sanitised HTML rendered once on save; null when the revision has none stored. */
	buildNotesHtml: string | null;
	disclosure: { kind: 'none' | 'sponsored' | 'affiliate'; note: string | null };
	/** https link to the author's external build walkthrough, if any. */
	walkthroughUrl: string | null;
	/** Revisions a reader may compare: published ones, oldest first. */
	revisions: RevisionRef[];
}

export interface GuidePage {
	/** Set when an editor has hid the guide; only its author and editors get the page then. */
	hidden?: { reason: string; hiddenAt: string } | null;
	guide: PricedGuide;
	extras: GuidePageExtras;
}

export type { RevisionDiff };

/** A guide on the browse page: its card, with the picks total in the shown region. */
export interface BrowseItem extends GuideCard {
	/** The region `picksTotal` is priced in (the base region when none was chosen). */
	pricedIn: RegionSummary;
	/**
	 * FPS per 100 units of `pricedIn`'s currency, the guide page's own figure (domain/value.ts):
	 * null without frame results, without a complete total, or when no region was chosen.
	 */
	fpsPer100: number | null;
	/** The target budget in `pricedIn`'s currency (null without a rate), so a card shows one currency. */
	budgetInRegion: Money | null;
}

export interface BrowseResult {
	items: BrowseItem[];
	total: number;
	page: number;
	pageCount: number;
	/** The reader's region, when one was chosen. */
	region: RegionSummary | null;
	/** Every region, for the form. */
	regions: RegionSummary[];
	/** Every tag used by a published guide, for the form. */
	tags: string[];
}
