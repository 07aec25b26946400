import { z } from 'zod';
import { galleryInput } from './photos';
import { ALTERNATE_REASONS, PART_CATEGORIES } from '$lib/domain/types';
import type { FormReader } from './form-data';
import { amount, id, pastIsoDate, regionCode, version } from './primitives';

/*
 * The guide editor's input (pages and the author JSON API share it). Every object is strict:
 * fields the author may not set (authorId, state, featured, slug, version inside the draft)
 * are rejected, never silently dropped (ASVS 8.2.3).
 */

export const GUIDE_TAG_GROUPS = {
	'Use case': ['gaming', 'creator', 'office', 'quiet', 'budget'],
	Resolution: ['1080p', '1440p', '4k'],
	'Form factor': ['atx', 'microatx', 'mini-itx', 'compact']
} as const;
export const GUIDE_TAGS = Object.values(GUIDE_TAG_GROUPS).flat();
export type GuideTag = (typeof GUIDE_TAGS)[number];

export const GUIDE_DISCLOSURES = ['none', 'sponsored', 'affiliate'] as const;
export type GuideDisclosure = (typeof GUIDE_DISCLOSURES)[number];
export const DISCLOSURE_LABELS: Record<GuideDisclosure, string> = {
	none: 'No sponsorship and no affiliate links',
	sponsored: 'Sponsored parts (named in the note)',
	affiliate: 'Affiliate links present'
};

/** The four build-notes sections, stored as one Markdown document under these headings. */
export const BUILD_NOTE_SECTIONS = [
	{ key: 'firmware', heading: 'Firmware setup checklist' },
	{ key: 'assembly', heading: 'Assembly steps' },
	{ key: 'cabling', heading: 'Cable routing' },
	{ key: 'display', heading: 'Display pairing' }
] as const;
export type BuildNoteKey = (typeof BUILD_NOTE_SECTIONS)[number]['key'];

/**
 * How many rows a draft may hold. The editor's form reader (guide-editor-form.ts) stops at
 * the same caps, so an oversized post is refused while it is read, not after.
 */
export const DRAFT_LIMITS = { slots: 40, alternatesPerSlot: 10, frames: 30, thermals: 20 } as const;

/** An amount as typed ("700", "699.99", "129,90" where the base region writes the comma). */
const decimalAmount = amount();

const observedDate = pastIsoDate({ future: 'The price cannot be observed in the future.' });

const optionalText = (max: number) =>
	z
		.string()
		.trim()
		.max(max)
		.nullish()
		.transform((s) => (s ? s : null));

export const guideMetaFields = {
	title: z.string().trim().min(3, 'Give the guide a title of at least 3 characters.').max(160),
	summary: z.string().trim().min(1, 'Write a short summary.').max(2000),
	targetBudget: decimalAmount,
	baseRegion: regionCode(),
	tags: z
		.array(z.enum(GUIDE_TAGS as [GuideTag, ...GuideTag[]]))
		.max(GUIDE_TAGS.length)
		.default([]),
	disclosure: z.enum(GUIDE_DISCLOSURES, { message: 'Choose a disclosure.' }),
	disclosureNote: optionalText(1000),
	walkthroughUrl: optionalText(500).refine(
		(s) => s === null || /^https:\/\/[^\s/]+\.[^\s]+$/.test(s),
		'Use an https:// link.'
	)
};

export const createGuideInput = z.strictObject(guideMetaFields);
export type CreateGuideInput = z.infer<typeof createGuideInput>;

/** The new-guide form (/my/guides/new) in createGuideInput's shape; its text comes back on a failure. */
export function createGuideForm(f: FormReader) {
	const text = (name: string) => f.text(name) ?? '';
	return {
		title: text('title'),
		summary: text('summary'),
		targetBudget: text('targetBudget'),
		baseRegion: text('baseRegion'),
		tags: f.all('tags'),
		disclosure: text('disclosure'),
		disclosureNote: text('disclosureNote'),
		walkthroughUrl: text('walkthroughUrl')
	};
}

export const priceQuoteInput = z.strictObject({
	storeId: id('store'),
	amount: decimalAmount,
	observedAt: observedDate
});

export const alternateInput = z.strictObject({
	partId: id('part'),
	reasonTag: z.enum(ALTERNATE_REASONS, { message: 'Choose a reason.' }),
	note: z.string().trim().max(500).default('')
});

export const slotInput = z.strictObject({
	/*
	 * The slot's own key, as GET draft and the editor form hand it back; left out for a slot
	 * the author adds now (the save gives it a new one). Sync and revision diff match slots by
	 * it, so a renamed slot stays the same slot and labels may repeat.
	 */
	slotKey: z
		.uuid('This slot’s key is not valid: reload the editor and make the change again.')
		.nullish()
		.transform((k) => k ?? null),
	category: z.enum(PART_CATEGORIES, { message: 'Choose a category.' }),
	label: z.string().trim().min(1, 'Give the slot a label.').max(80),
	quantity: z
		.number({ error: 'Enter the quantity as a whole number from 1 to 16.' })
		.int('Enter the quantity as a whole number from 1 to 16.')
		.min(1, 'At least 1.')
		.max(16, 'At most 16.'),
	pickPartId: id('part'),
	reason: z.string().trim().min(1, 'Say why you picked it.').max(2000),
	priceQuote: priceQuoteInput.nullish().transform((q) => q ?? null),
	/** In rank order: the first is the author's first fallback. */
	alternates: z
		.array(alternateInput)
		.max(DRAFT_LIMITS.alternatesPerSlot, 'At most 10 alternates per slot.')
		.default([])
});
export type SlotDraftInput = z.infer<typeof slotInput>;

export const buildNotesInput = z.strictObject({
	firmware: z.string().max(20000).default(''),
	assembly: z.string().max(20000).default(''),
	cabling: z.string().max(20000).default(''),
	display: z.string().max(20000).default('')
});
export type BuildNotesInput = z.infer<typeof buildNotesInput>;

/** Highest FPS the editor accepts: anything above is a typo, not a measurement. */
export const MAX_FPS = 2000;

/** FPS as typed with at most one decimal ("143.5"); stored as tenths, so one place is exact. */
const fpsText = (what: string) =>
	z
		.string()
		.trim()
		.regex(/^\d{1,4}(\.\d)?$/, `Enter the ${what} like 143.5 (one decimal at most).`)
		.refine((s) => Number(s) > 0, `The ${what} must be above 0.`)
		.refine((s) => Number(s) <= MAX_FPS, `The ${what} must be at most ${MAX_FPS}.`);

/** "143.5" → 1435 (the regex above guarantees at most one decimal). */
export function fpsToTenths(fps: string): number {
	const [whole = '0', tenth = '0'] = fps.split('.');
	return Number(whole) * 10 + Number(tenth || '0');
}

export function tenthsToFps(tenths: number): string {
	return tenths % 10 === 0 ? String(tenths / 10) : `${Math.floor(tenths / 10)}.${tenths % 10}`;
}

export const frameResultInput = z
	.strictObject({
		workload: z
			.string()
			.trim()
			.min(1, 'Name the game or application.')
			.max(120, 'At most 120 characters.'),
		resolution: z
			.string()
			.trim()
			.regex(/^\d{3,5}x\d{3,5}$/, 'Enter a resolution like 2560x1440.'),
		preset: z.string().trim().max(60, 'At most 60 characters.').default(''),
		avgFps: fpsText('average FPS'),
		/** Empty when the author did not measure it. */
		low1Fps: z
			.union([fpsText('1 % low FPS'), z.literal(''), z.null()])
			.optional()
			.transform((s) => (s ? s : null)),
		notes: z.string().trim().max(500, 'At most 500 characters.').default('')
	})
	.superRefine((r, ctx) => {
		if (r.low1Fps !== null && fpsToTenths(r.low1Fps) > fpsToTenths(r.avgFps)) {
			ctx.addIssue({
				code: 'custom',
				path: ['low1Fps'],
				message: 'The 1 % low cannot be above the average FPS.'
			});
		}
	});
export type FrameResultInput = z.infer<typeof frameResultInput>;

/** A whole number in [min, max] or null (not measured). */
const reading = (what: string, max: number, unit: string) =>
	z
		.number({ message: `Enter the ${what} as a whole number.` })
		.int(`Enter the ${what} as a whole number.`)
		.min(0, `The ${what} cannot be below 0 ${unit}.`)
		.max(max, `The ${what} must be at most ${max} ${unit}.`)
		.nullable()
		.default(null);

export const thermalResultInput = z.strictObject({
	loadName: z
		.string()
		.trim()
		.min(1, 'Name the load (e.g. a stress test or a game).')
		.max(120, 'At most 120 characters.'),
	cpuTempC: reading('CPU temperature', 120, '°C'),
	gpuTempC: reading('GPU temperature', 120, '°C'),
	cpuUtilPct: reading('CPU utilisation', 100, '%'),
	gpuUtilPct: reading('GPU utilisation', 100, '%')
});
export type ThermalResultInput = z.infer<typeof thermalResultInput>;

export const draftInput = z.strictObject({
	...guideMetaFields,
	buildNotes: buildNotesInput,
	slots: z
		.array(slotInput)
		.min(1, 'Add at least one slot.')
		.max(DRAFT_LIMITS.slots, 'At most 40 slots.')
		.superRefine((slots, ctx) => {
			// Two slots with one key would be one slot twice to sync and diff.
			const seen = new Set<string>();
			for (const [i, s] of slots.entries()) {
				if (s.slotKey === null) continue;
				if (seen.has(s.slotKey))
					ctx.addIssue({
						code: 'custom',
						path: [i, 'slotKey'],
						message: 'This slot appears twice: reload the editor and make the change again.'
					});
				seen.add(s.slotKey);
			}
		}),
	/*
	 * Left out (API clients that predate results) = keep the stored ones; a new revision then
	 * copies them from the frozen one. Sent (the editor always sends them) = replace.
	 */
	frames: z
		.array(frameResultInput)
		.max(DRAFT_LIMITS.frames, 'At most 30 frame results.')
		.optional(),
	thermals: z
		.array(thermalResultInput)
		.max(DRAFT_LIMITS.thermals, 'At most 20 thermal results.')
		.optional(),
	/** The photo gallery in order (schemas/photos.ts); left out = keep, like the results above. */
	gallery: galleryInput.optional()
});
export type DraftInput = z.infer<typeof draftInput>;
/** What the editor form and GET draft hand around before parsing (same shape). */
export type DraftFields = z.input<typeof draftInput>;

/** PUT /api/v1/guides/[slug]/draft and the editor's save: the draft plus the version it edits. */
export const saveDraftInput = z.strictObject({ ...draftInput.shape, version });
export type SaveDraftInput = z.infer<typeof saveDraftInput>;

export const submitInput = z.strictObject({ version });

/**
 * What GET /api/v1/guides/[slug]/draft answers beside the draft itself: shown, never set
 * (the guide's slug and state, the revision's number and state, what the server derives
 * from the input: the currency of the base region, the notes as HTML, each part's summary).
 * PUT takes a GET answer back as it came, so these are dropped before saveDraftInput parses
 * the body. Nothing else is: an unknown field, or one only the workflow sets that GET does
 * not show (authorId, featured), is still refused.
 */
export const DRAFT_READ_ONLY = {
	draft: [
		'slug',
		'currency',
		'buildNotesHtml',
		'state',
		'revisionNumber',
		'revisionState',
		'submittedAt',
		'publishedRevisionNumber'
	],
	slot: ['pick'],
	alternate: ['part']
} as const;

function isRecord(value: unknown): value is Record<string, unknown> {
	return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function without(value: unknown, keys: readonly string[]): unknown {
	if (!isRecord(value)) return value;
	const kept = { ...value };
	for (const key of keys) delete kept[key];
	return kept;
}

/** A PUT body with the read-only fields a GET answer carries left out (see DRAFT_READ_ONLY). */
export function withoutReadOnly(body: unknown): unknown {
	const draft = without(body, DRAFT_READ_ONLY.draft);
	if (!isRecord(draft) || !Array.isArray(draft.slots)) return draft;
	return {
		...draft,
		slots: draft.slots.map((slot) => {
			const kept = without(slot, DRAFT_READ_ONLY.slot);
			return isRecord(kept) && Array.isArray(kept.alternates)
				? { ...kept, alternates: kept.alternates.map((a) => without(a, DRAFT_READ_ONLY.alternate)) }
				: kept;
		})
	};
}

/** The preview action: the four sections only. */
export const previewInput = buildNotesInput;

/** One Markdown document with a `##` heading per non-empty section. */
export function joinBuildNotes(notes: BuildNotesInput): string {
	return BUILD_NOTE_SECTIONS.filter((s) => notes[s.key].trim() !== '')
		.map((s) => `## ${s.heading}\n\n${notes[s.key].trim()}\n`)
		.join('\n');
}

/**
 * Splits a stored document back into the four sections. Text under an unknown heading
 * (or before the first heading) stays with the section before it, headings included, so
 * nothing an author wrote is lost.
 */
export function splitBuildNotes(md: string): BuildNotesInput {
	const notes: BuildNotesInput = { firmware: '', assembly: '', cabling: '', display: '' };
	let current: BuildNoteKey = 'firmware';
	const lines: Record<BuildNoteKey, string[]> = {
		firmware: [],
		assembly: [],
		cabling: [],
		display: []
	};
	for (const line of md.split('\n')) {
		const heading = /^##\s+(.+?)\s*$/.exec(line)?.[1]?.toLowerCase();
		const section = heading
			? BUILD_NOTE_SECTIONS.find((s) => s.heading.toLowerCase() === heading)
			: undefined;
		if (section) current = section.key;
		else lines[current].push(line);
	}
	for (const key of Object.keys(lines) as BuildNoteKey[]) notes[key] = lines[key].join('\n').trim();
	return notes;
}
