import type { PartCategory } from '$lib/domain/types';
import { DRAFT_LIMITS } from './guide-editor';
import type { BuildNotesInput } from './guide-editor';
import {
	applyGalleryOp,
	galleryFromDraft,
	galleryToInput,
	GALLERY_SHOWN_FIELD
} from './gallery-form';
import type { EditorGalleryItem } from './gallery-form';
import { FORM_ISSUES_KEY, type Issues } from './issues';
import { GALLERY_MAX_PHOTOS } from './photos';
import { wholeNumberFromText } from './primitives';

/*
 * The guide editor's working state as the form holds it (strings as typed), and the
 * conversions between it, the posted form, the stored draft and the zod input. Field names
 * are dotted paths (`slots.2.alternates.0.partId`) so the same form works without
 * JavaScript: add/remove/reorder buttons post `op` to ?/edit, which applies it here.
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

/**
 * The most rows the editor sends, from draftInput's own limits, and the most fields a form
 * of that size has (a slot is 11 fields plus 5 per alternate, the typed part names of the
 * no-JS form included; a frame row 7, a thermal row 6; a photo 4; the rest about 30: 3,040
 * in all), with room to spare.
 */
export const EDITOR_FORM_LIMITS = {
	slots: DRAFT_LIMITS.slots,
	alternates: DRAFT_LIMITS.alternatesPerSlot,
	frames: DRAFT_LIMITS.frames,
	thermals: DRAFT_LIMITS.thermals,
	gallery: GALLERY_MAX_PHOTOS,
	fields: 3500
} as const;

const SLOT_FIELDS = [
	'key',
	'slotKey',
	'category',
	'label',
	'quantity',
	'pickPartId',
	'pickQuery',
	'reason',
	'quoteStoreId',
	'quoteAmount',
	'quoteObservedAt'
] as const;
const ALTERNATE_FIELDS = ['key', 'partId', 'partQuery', 'reasonTag', 'note'] as const;
const FRAME_FIELDS = [
	'key',
	'workload',
	'resolution',
	'preset',
	'avgFps',
	'low1Fps',
	'notes'
] as const;
const THERMAL_FIELDS = [
	'key',
	'loadName',
	'cpuTempC',
	'gpuTempC',
	'cpuUtilPct',
	'gpuUtilPct'
] as const;
const GALLERY_FIELDS = ['photoId', 'stage', 'caption', 'altText'] as const;
const META_FIELDS = [
	'title',
	'summary',
	'targetBudget',
	'baseRegion',
	'disclosure',
	'disclosureNote',
	'walkthroughUrl'
] as const;
const NOTE_FIELDS = ['firmware', 'assembly', 'cabling', 'display'] as const;

/** A row index as the editor writes it: plain digits, no leading zero ("0", "12"). */
const INDEX = /^(?:0|[1-9][0-9]{0,3})$/;

type Row = Record<string, string>;

/** Rows by index, kept sparse while reading; `over` marks an index at or past the cap. */
class Rows {
	readonly byIndex = new Map<number, Row>();
	over = false;
	constructor(readonly cap: number) {}
	/** The row at `index` (created on first use), or null when the index is past the cap. */
	at(index: number): Row | null {
		if (index >= this.cap) {
			this.over = true;
			return null;
		}
		let row = this.byIndex.get(index);
		if (!row) this.byIndex.set(index, (row = {}));
		return row;
	}
	/** Rows that carry their required field, in index order: gaps left by removed rows close up. */
	kept(required: string): [number, Row][] {
		return [...this.byIndex.entries()]
			.filter(([, row]) => required in row)
			.sort(([a], [b]) => a - b);
	}
}

/**
 * Reads the posted editor form in one pass over its fields (issue 12: the old reader rescanned
 * every key with a new regular expression inside its loop conditions, quadratic in the form's
 * size). Anything missing becomes empty, and zod reports it later. A repeated field keeps its
 * first value, as FormData.get does. Rows past the schema's caps and fields past the field
 * cap are not read; each cap adds one message, under the same key and words as the schema's.
 */
export function readEditorForm(data: FormData): {
	draft: EditorDraft;
	issues: Issues;
	/** The `version` field, a number when it is plain digits (else as posted, for the schema to refuse). */
	version: unknown;
	op: string;
} {
	const issues: Issues = {};
	const top: Row = {};
	const tags: string[] = [];
	const slots = new Rows(EDITOR_FORM_LIMITS.slots);
	const alternates = new Map<number, Rows>();
	const frames = new Rows(EDITOR_FORM_LIMITS.frames);
	const thermals = new Rows(EDITOR_FORM_LIMITS.thermals);
	const gallery = new Rows(EDITOR_FORM_LIMITS.gallery);
	const set = (row: Row | null, field: string, value: string) => {
		if (row && !(field in row)) row[field] = value;
	};

	let fields = 0;
	for (const [key, value] of data) {
		if (++fields > EDITOR_FORM_LIMITS.fields) {
			issues[FORM_ISSUES_KEY] = [
				`The form has more fields than the editor sends (at most ${EDITOR_FORM_LIMITS.fields}). Reload the editor and try again.`
			];
			break;
		}
		if (typeof value !== 'string') continue;
		if (key === 'tags') {
			tags.push(value);
			continue;
		}
		const parts = key.split('.');
		const [list, index, field, altIndex, altField] = parts;
		if (parts.length === 1 || (parts.length === 2 && list === 'buildNotes')) {
			set(top, key, value);
			continue;
		}
		if (index === undefined || field === undefined || !INDEX.test(index)) continue;
		const i = Number(index);
		if (list === 'slots' && parts.length === 3) set(slots.at(i), field, value);
		else if (list === 'slots' && parts.length === 5 && field === 'alternates') {
			if (altIndex === undefined || altField === undefined || !INDEX.test(altIndex)) continue;
			if (!slots.at(i)) continue;
			let rows = alternates.get(i);
			if (!rows) alternates.set(i, (rows = new Rows(EDITOR_FORM_LIMITS.alternates)));
			set(rows.at(Number(altIndex)), altField, value);
		} else if (list === 'frames' && parts.length === 3) set(frames.at(i), field, value);
		else if (list === 'thermals' && parts.length === 3) set(thermals.at(i), field, value);
		else if (list === 'gallery' && parts.length === 3) set(gallery.at(i), field, value);
	}

	const pick = <F extends string>(row: Row, names: readonly F[]) =>
		Object.fromEntries(names.map((n) => [n, row[n] ?? ''])) as Record<F, string>;

	const slotRows = slots.kept('category');
	if (slots.over) issues.slots = [`At most ${EDITOR_FORM_LIMITS.slots} slots.`];
	const draftSlots: EditorSlot[] = slotRows.map(([i, row], n) => {
		const alts = alternates.get(i);
		if (alts?.over)
			issues[`slots.${n}.alternates`] = [
				`At most ${EDITOR_FORM_LIMITS.alternates} alternates per slot.`
			];
		return {
			...pick(row, SLOT_FIELDS),
			key: row.key || `s${i}`,
			category: (row.category ?? '') as PartCategory,
			alternates: (alts?.kept('partId') ?? []).map(([j, alt]) => ({
				...pick(alt, ALTERNATE_FIELDS),
				key: alt.key || `s${i}a${j}`
			}))
		};
	});
	if (frames.over) issues.frames = [`At most ${EDITOR_FORM_LIMITS.frames} frame results.`];
	if (thermals.over) issues.thermals = [`At most ${EDITOR_FORM_LIMITS.thermals} thermal results.`];
	if (gallery.over) issues.gallery = [`At most ${EDITOR_FORM_LIMITS.gallery} photos.`];

	const meta = pick(top, META_FIELDS);
	return {
		draft: {
			...meta,
			tags,
			buildNotes: Object.fromEntries(
				NOTE_FIELDS.map((n) => [n, top[`buildNotes.${n}`] ?? ''])
			) as BuildNotesInput,
			slots: draftSlots,
			frames: frames
				.kept('workload')
				.map(([i, row]) => ({ ...pick(row, FRAME_FIELDS), key: row.key || `f${i}` })),
			thermals: thermals
				.kept('loadName')
				.map(([i, row]) => ({ ...pick(row, THERMAL_FIELDS), key: row.key || `t${i}` })),
			// No gallery section in the form = keep the stored gallery (an empty one = no photos).
			gallery:
				GALLERY_SHOWN_FIELD in top
					? gallery.kept('photoId').map(([, row]) => ({
							...pick(row, GALLERY_FIELDS),
							key: `g${row.photoId ?? ''}`
						}))
					: undefined
		},
		issues,
		version: wholeNumberFromText(top.version ?? ''),
		op: top.op ?? ''
	};
}

/** The working copy a posted form holds (readEditorForm without its messages). */
export function fromForm(data: FormData): EditorDraft {
	return readEditorForm(data).draft;
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
