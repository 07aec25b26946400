/*
 * The guide editor's posted form read back into its working copy (schemas/guide-editor-form.ts):
 * dotted field names (`slots.2.alternates.0.partId`) to rows, with caps on rows and fields so
 * an oversized or hostile post is refused with a message, not parsed.
 */
import type { PartCategory } from '$lib/domain/types';
import { GALLERY_SHOWN_FIELD } from './gallery-form';
import { DRAFT_LIMITS } from './guide-editor';
import type { BuildNotesInput } from './guide-editor';
import type { EditorDraft, EditorSlot } from './guide-editor-form';
import { FORM_ISSUES_KEY, type Issues } from './issues';
import { GALLERY_MAX_PHOTOS } from './photos';
import { wholeNumberFromText } from './primitives';

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
