import type { PartCategory } from '$lib/domain/types';
import type { BuildNotesInput } from './guide-editor';
import { applyGalleryOp, galleryFromDraft, galleryToInput } from './gallery-form';
import type { EditorGalleryItem } from './gallery-form';
import { wholeNumberFromText } from './primitives';

/*
 * The guide editor's working state as the form holds it (strings as typed), and the
 * conversions between it, the posted form, the stored draft and the zod input. Field names
 * are dotted paths (`slots.2.alternates.0.partId`) so the same form works without
 * JavaScript: add/remove/reorder buttons post `op` to ?/edit, which applies it here. Reading
 * the posted form back is schemas/guide-editor-post.ts.
 */

export interface EditorAlternate {
	key: string;
	partId: string;
	/** A part name or slug typed without JavaScript; the server looks it up (services/part-lookup.ts). */
	partQuery: string;
	reasonTag: string;
	note: string;
}

export interface EditorSlot {
	/** Keys the editor's rows; the slot's own key when it has one. */
	key: string;
	/** The slot's own key (guide_slots.slot_key), round-tripped as a hidden field; '' for a new slot. */
	slotKey: string;
	category: PartCategory;
	label: string;
	quantity: string;
	pickPartId: string;
	/** A part name or slug typed without JavaScript; the server looks it up (services/part-lookup.ts). */
	pickQuery: string;
	reason: string;
	quoteStoreId: string;
	quoteAmount: string;
	quoteObservedAt: string;
	alternates: EditorAlternate[];
}

/** One frame-result row as typed; FPS as decimal text ("143.5"). */
export interface EditorFrame {
	key: string;
	workload: string;
	resolution: string;
	preset: string;
	avgFps: string;
	low1Fps: string;
	notes: string;
}

/** One thermal row as typed; empty readings mean "not measured". */
export interface EditorThermal {
	key: string;
	loadName: string;
	cpuTempC: string;
	gpuTempC: string;
	cpuUtilPct: string;
	gpuUtilPct: string;
}

export interface EditorDraft {
	title: string;
	summary: string;
	targetBudget: string;
	baseRegion: string;
	tags: string[];
	disclosure: string;
	disclosureNote: string;
	walkthroughUrl: string;
	buildNotes: BuildNotesInput;
	slots: EditorSlot[];
	frames: EditorFrame[];
	thermals: EditorThermal[];
	/** Photos in order (gallery-form.ts); undefined when the form had no gallery section. */
	gallery?: EditorGalleryItem[];
}

/** The subset of the stored draft (services/guide-drafts DraftView) the editor starts from. */
export interface DraftLike {
	title: string;
	summary: string;
	targetBudget: string;
	baseRegion: string;
	tags: string[];
	disclosure: string;
	disclosureNote: string | null;
	walkthroughUrl: string | null;
	buildNotes: BuildNotesInput;
	slots: {
		slotKey: string;
		category: PartCategory;
		label: string;
		quantity: number;
		pickPartId: number;
		reason: string;
		priceQuote: { storeId: number; amount: string; observedAt: string } | null;
		alternates: { partId: number; reasonTag: string; note: string }[];
	}[];
	frames: {
		workload: string;
		resolution: string;
		preset: string;
		avgFps: string;
		low1Fps: string | null;
		notes: string;
	}[];
	thermals: {
		loadName: string;
		cpuTempC: number | null;
		gpuTempC: number | null;
		cpuUtilPct: number | null;
		gpuUtilPct: number | null;
	}[];
	gallery?: { photoId: number; stage: string; caption: string; altText: string }[];
}

let counter = 0;
export function newKey(): string {
	counter += 1;
	return `k${Date.now().toString(36)}${counter}`;
}

export function emptySlot(category: PartCategory = 'cpu', key = newKey()): EditorSlot {
	return {
		key,
		slotKey: '',
		category,
		label: '',
		quantity: '1',
		pickPartId: '',
		pickQuery: '',
		reason: '',
		quoteStoreId: '',
		quoteAmount: '',
		quoteObservedAt: '',
		alternates: []
	};
}

export function emptyAlternate(key = newKey()): EditorAlternate {
	return { key, partId: '', partQuery: '', reasonTag: 'lower_price', note: '' };
}

export function emptyFrame(key = newKey()): EditorFrame {
	return { key, workload: '', resolution: '', preset: '', avgFps: '', low1Fps: '', notes: '' };
}

export function emptyThermal(key = newKey()): EditorThermal {
	return { key, loadName: '', cpuTempC: '', gpuTempC: '', cpuUtilPct: '', gpuUtilPct: '' };
}

const reading = (n: number | null) => (n === null ? '' : String(n));

export function fromDraft(d: DraftLike): EditorDraft {
	return {
		title: d.title,
		summary: d.summary,
		targetBudget: d.targetBudget,
		baseRegion: d.baseRegion,
		tags: [...d.tags],
		disclosure: d.disclosure,
		disclosureNote: d.disclosureNote ?? '',
		walkthroughUrl: d.walkthroughUrl ?? '',
		buildNotes: { ...d.buildNotes },
		slots: d.slots.map((s) => ({
			key: s.slotKey,
			slotKey: s.slotKey,
			category: s.category,
			label: s.label,
			quantity: String(s.quantity),
			pickPartId: String(s.pickPartId),
			pickQuery: '',
			reason: s.reason,
			quoteStoreId: s.priceQuote ? String(s.priceQuote.storeId) : '',
			quoteAmount: s.priceQuote?.amount ?? '',
			quoteObservedAt: s.priceQuote?.observedAt ?? '',
			alternates: s.alternates.map((a, j) => ({
				key: `${s.slotKey}a${j}`,
				partId: String(a.partId),
				partQuery: '',
				reasonTag: a.reasonTag,
				note: a.note
			}))
		})),
		frames: d.frames.map((f, i) => ({
			key: `f${i}`,
			workload: f.workload,
			resolution: f.resolution,
			preset: f.preset,
			avgFps: f.avgFps,
			low1Fps: f.low1Fps ?? '',
			notes: f.notes
		})),
		thermals: d.thermals.map((t, i) => ({
			key: `t${i}`,
			loadName: t.loadName,
			cpuTempC: reading(t.cpuTempC),
			gpuTempC: reading(t.gpuTempC),
			cpuUtilPct: reading(t.cpuUtilPct),
			gpuUtilPct: reading(t.gpuUtilPct)
		})),
		gallery: galleryFromDraft(d.gallery)
	};
}

/** Whole numbers as the shared rule reads them: digits only (schemas/primitives.ts). */
const num = (s: string) => wholeNumberFromText(s);
/** Empty → null (not measured); anything else as `num` reads it (zod refuses what is not a number). */
const optNum = (s: string) => (s.trim() === '' ? null : wholeNumberFromText(s));

/** The object draftInput parses: numbers where the schema wants numbers, empty quote → null. */
export function toInput(d: EditorDraft): Record<string, unknown> {
	return {
		title: d.title,
		summary: d.summary,
		targetBudget: d.targetBudget,
		baseRegion: d.baseRegion,
		tags: d.tags,
		disclosure: d.disclosure,
		disclosureNote: d.disclosureNote,
		walkthroughUrl: d.walkthroughUrl,
		buildNotes: d.buildNotes,
		slots: d.slots.map((s) => ({
			...(s.slotKey ? { slotKey: s.slotKey } : {}),
			category: s.category,
			label: s.label,
			quantity: num(s.quantity),
			pickPartId: num(s.pickPartId),
			reason: s.reason,
			priceQuote:
				s.quoteStoreId || s.quoteAmount || s.quoteObservedAt
					? { storeId: num(s.quoteStoreId), amount: s.quoteAmount, observedAt: s.quoteObservedAt }
					: null,
			alternates: s.alternates.map((a) => ({
				partId: num(a.partId),
				reasonTag: a.reasonTag,
				note: a.note
			}))
		})),
		frames: d.frames.map((f) => ({
			workload: f.workload,
			resolution: f.resolution,
			preset: f.preset,
			avgFps: f.avgFps,
			low1Fps: f.low1Fps,
			notes: f.notes
		})),
		thermals: d.thermals.map((t) => ({
			loadName: t.loadName,
			cpuTempC: optNum(t.cpuTempC),
			gpuTempC: optNum(t.gpuTempC),
			cpuUtilPct: optNum(t.cpuUtilPct),
			gpuUtilPct: optNum(t.gpuUtilPct)
		})),
		...(d.gallery ? { gallery: galleryToInput(d.gallery) } : {})
	};
}

function swap<T>(list: T[], i: number, j: number): T[] {
	if (i < 0 || j < 0 || i >= list.length || j >= list.length) return list;
	const copy = [...list];
	[copy[i], copy[j]] = [copy[j] as T, copy[i] as T];
	return copy;
}

/** Applies an editor operation (`slotUp:2`, `addAlt:0`, `altDown:1:0`…); unknown ops change nothing. */
export function applyOp(d: EditorDraft, op: string): EditorDraft {
	const gallery = applyGalleryOp(d.gallery ?? [], op);
	if (gallery) return { ...d, gallery };
	const [name, a = '-1', b = '-1'] = op.split(':');
	const i = Number(a);
	const j = Number(b);
	const slots = [...d.slots];
	const slot = slots[i];
	switch (name) {
		case 'addSlot':
			return { ...d, slots: [...slots, emptySlot()] };
		case 'removeSlot':
			return { ...d, slots: slots.filter((_, k) => k !== i) };
		case 'slotUp':
			return { ...d, slots: swap(slots, i, i - 1) };
		case 'slotDown':
			return { ...d, slots: swap(slots, i, i + 1) };
		case 'addFrame':
			return { ...d, frames: [...d.frames, emptyFrame()] };
		case 'removeFrame':
			return { ...d, frames: d.frames.filter((_, k) => k !== i) };
		case 'addThermal':
			return { ...d, thermals: [...d.thermals, emptyThermal()] };
		case 'removeThermal':
			return { ...d, thermals: d.thermals.filter((_, k) => k !== i) };
	}
	if (!slot) return d;
	const withAlternates = (alternates: EditorAlternate[]) => ({
		...d,
		slots: slots.map((s, k) => (k === i ? { ...slot, alternates } : s))
	});
	switch (name) {
		case 'addAlt':
			return withAlternates([...slot.alternates, emptyAlternate()]);
		case 'removeAlt':
			return withAlternates(slot.alternates.filter((_, k) => k !== j));
		case 'altUp':
			return withAlternates(swap(slot.alternates, j, j - 1));
		case 'altDown':
			return withAlternates(swap(slot.alternates, j, j + 1));
	}
	return d;
}

/** Moves a slot from one position to another (drag and drop). */
export function moveSlot(d: EditorDraft, from: number, to: number): EditorDraft {
	if (from === to || from < 0 || to < 0 || from >= d.slots.length || to >= d.slots.length) return d;
	const slots = [...d.slots];
	const [moved] = slots.splice(from, 1);
	if (moved) slots.splice(to, 0, moved);
	return { ...d, slots };
}

/**
 * The editor opened from a fork-insights suggestion: the part readers commonly swapped the
 * slot to, added as a new last alternate of that slot in the working copy (nothing is saved
 * until the author saves). A slot that is gone, or a part already its pick or an alternate,
 * leaves the draft as it is.
 */
export function withSuggestedAlternate(
	d: EditorDraft,
	suggestion: { slotKey: string; partId: number } | null
): EditorDraft {
	if (!suggestion) return d;
	const partId = String(suggestion.partId);
	const i = d.slots.findIndex((s) => s.slotKey === suggestion.slotKey);
	const slot = d.slots[i];
	if (!slot || slot.pickPartId === partId || slot.alternates.some((a) => a.partId === partId))
		return d;
	const alternate = {
		...emptyAlternate(),
		partId,
		note: 'A common choice in readers’ builds of this guide.'
	};
	return {
		...d,
		slots: d.slots.map((s, k) => (k === i ? { ...s, alternates: [...s.alternates, alternate] } : s))
	};
}
