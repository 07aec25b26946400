import { z } from 'zod';
import { MAX_ID, isoDate, wholeNumberText } from './primitives';
import { pageNumber } from './query-params';
import { PART_CATEGORIES, type PartCategory } from '$lib/domain/types';
import { SPEC_SCHEMAS } from './part-specs';

/*
 * Inputs of the editor's catalog upkeep: parts, stores, quotes. Shared by the form
 * actions and the CSV import, so a row in a file and a form submission are held to the
 * same rules and get the same messages. Every schema is strict: an unexpected field is
 * refused, never ignored (mass assignment).
 */

/** Parts, stores and quotes listed per page in the editor area. */
export const EDITOR_PAGE_SIZE = 50;

/**
 * Slugs the editor's own URLs use (/editor/parts/new, /editor/parts/import): a part with
 * one of these could not be opened for editing, so they are refused for every part.
 */
export const RESERVED_PART_SLUGS = ['new', 'import'] as const;

/**
 * A cell starting with one of these is run as a formula by spreadsheet programs (OWASP
 * "CSV Injection"); tab and carriage return too, because some programs strip them first.
 * Leading spaces are skipped before the check for the same reason.
 */
export const FORMULA_TRIGGERS = ['=', '+', '-', '@', '\t', '\r'] as const;

export function startsLikeFormula(value: string): boolean {
	if (value.startsWith('\t') || value.startsWith('\r')) return true;
	const first = value.trimStart().charAt(0);
	return first !== '' && (FORMULA_TRIGGERS as readonly string[]).includes(first);
}

const FORMULA_MESSAGE =
	'Must not start with =, +, -, @, a tab or a line break (spreadsheets run such cells as formulas).';

// Control characters other than tab and line breaks have no place in a name.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL_CHARS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

function nameText(what: string, max: number) {
	return z
		.string({ error: `Enter the ${what}.` })
		.trim()
		.min(1, `Enter the ${what}.`)
		.max(max, `Use at most ${max} characters for the ${what}.`)
		.refine(
			(v) => !CONTROL_CHARS.test(v) && !/[\r\n\t]/.test(v),
			'Use a single line without control characters.'
		)
		.refine((v) => !startsLikeFormula(v), FORMULA_MESSAGE);
}

const SLUG_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

export const partSlug = z
	.string({ error: 'Enter a slug.' })
	.trim()
	.min(1, 'Enter a slug.')
	.max(140, 'Use at most 140 characters for the slug.')
	.regex(
		SLUG_PATTERN,
		'Use lower-case letters, digits and single hyphens, e.g. "halvard-strata-606".'
	)
	.refine(
		(s) => !(RESERVED_PART_SLUGS as readonly string[]).includes(s),
		'This word is reserved; add the brand or model to it.'
	);

/** "Ærø Cool 5 — Pro" → "aero-cool-5-pro": the slug a part gets when none is given. */
export function slugify(...words: string[]): string {
	return words
		.join(' ')
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.replace(/æ/gi, 'ae')
		.replace(/ø/gi, 'o')
		.replace(/ß/g, 'ss')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 140)
		.replace(/-+$/, '');
}

export const partCategory = z.enum(PART_CATEGORIES, {
	error: `Choose one of: ${PART_CATEGORIES.join(', ')}.`
});

/**
 * The fields of a part besides its specs. An empty slug is derived from brand and model;
 * the specs are checked separately by validateSpecs, with the category's schema.
 */
export const partFieldsInput = z.strictObject({
	category: partCategory,
	brand: nameText('brand', 80),
	model: nameText('model', 120),
	slug: z.preprocess(
		(v) => (typeof v === 'string' && v.trim() === '' ? undefined : v),
		partSlug.optional()
	)
});
export type PartFieldsInput = z.infer<typeof partFieldsInput>;

/** A problem with one spec field: its dotted path inside the specs (e.g. "m2Slots.0.pcieGen"). */
export interface SpecIssue {
	path: string;
	message: string;
}

type RawIssue = {
	code: string;
	input?: unknown;
	expected?: string;
	origin?: string;
	minimum?: unknown;
	maximum?: unknown;
	inclusive?: boolean;
	values?: unknown[];
	keys?: string[];
	errors?: RawIssue[][];
	message?: string;
};

function list(values: unknown[]): string {
	return values.map((v) => String(v)).join(', ');
}

/**
 * Plain-language messages for spec problems (zod's defaults read like "Too small:
 * expected number to be >0"). Returning undefined keeps zod's own message.
 */
export function specIssueMessage(issue: RawIssue): string | undefined {
	switch (issue.code) {
		case 'invalid_type':
			if (issue.input === undefined) return 'Required.';
			if (issue.expected === 'int') return 'Enter a whole number.';
			if (issue.expected === 'number') return 'Enter a number.';
			if (issue.expected === 'boolean') return 'Must be true or false.';
			if (issue.expected === 'array') return 'Must be a list.';
			if (issue.expected === 'object') return 'Must be an object of fields.';
			if (issue.expected === 'string') return 'Must be text.';
			return undefined;
		case 'too_small':
			if (issue.origin === 'array') return `Choose at least ${String(issue.minimum)}.`;
			if (issue.origin === 'string')
				return Number(issue.minimum) <= 1
					? 'Required.'
					: `Use at least ${String(issue.minimum)} characters.`;
			return issue.inclusive
				? `Must be at least ${String(issue.minimum)}.`
				: `Must be more than ${String(issue.minimum)}.`;
		case 'too_big':
			if (issue.origin === 'array') return `At most ${String(issue.maximum)} allowed.`;
			if (issue.origin === 'string') return `Use at most ${String(issue.maximum)} characters.`;
			return issue.inclusive
				? `Must be at most ${String(issue.maximum)}.`
				: `Must be less than ${String(issue.maximum)}.`;
		case 'invalid_value':
			return `Choose one of: ${list(issue.values ?? [])}.`;
		case 'invalid_union': {
			// A union of literals (pcieGen 3 | 4 | 5): name the allowed values.
			const values = (issue.errors ?? []).flatMap((branch) =>
				branch.every((e) => e.code === 'invalid_value') ? branch.flatMap((e) => e.values ?? []) : []
			);
			if (issue.input === undefined) return 'Required.';
			return values.length ? `Choose one of: ${list(values)}.` : undefined;
		}
		case 'unrecognized_keys':
			return `Unknown field${(issue.keys?.length ?? 0) > 1 ? 's' : ''}: ${list(issue.keys ?? [])}.`;
		default:
			return undefined;
	}
}

/** Checks specs against their category's schema; issues carry dotted paths within the specs. */
export function validateSpecs(
	category: PartCategory,
	specs: unknown
): { ok: true; specs: Record<string, unknown> } | { ok: false; issues: SpecIssue[] } {
	const result = SPEC_SCHEMAS[category].safeParse(specs, {
		error: (issue) => specIssueMessage(issue as unknown as RawIssue)
	});
	if (result.success) return { ok: true, specs: result.data as Record<string, unknown> };
	return {
		ok: false,
		issues: result.error.issues.map((i) => ({
			path: i.path.map(String).join('.'),
			message: i.message
		}))
	};
}

const emptyAsUndefined = (value: unknown) =>
	typeof value === 'string' && value.trim() === '' ? undefined : value;

const webAddress = z
	.string()
	.trim()
	.max(500, 'Use at most 500 characters for the address.')
	.refine((v) => {
		try {
			const url = new URL(v);
			return (url.protocol === 'https:' || url.protocol === 'http:') && url.hostname !== '';
		} catch {
			return false;
		}
	}, 'Enter a full web address starting with https://.');

const regionCode = z
	.string({ error: 'Choose a region.' })
	.trim()
	.toLowerCase()
	.regex(/^[a-z]{2,8}$/, 'Choose a region.');

/** POST ?/create and ?/update on /editor/stores. */
export const storeInput = z.strictObject({
	name: nameText('store name', 120),
	regionCode,
	url: webAddress
});
export type StoreInput = z.infer<typeof storeInput>;

const id = (what: string) => wholeNumberText(`Unknown ${what}.`, 1, MAX_ID);

export const storeIdInput = z.strictObject({ storeId: id('store') });

/** POST ?/update on /editor/stores: the store's id plus its fields. */
export const storeUpdateInput = storeInput.extend({ storeId: id('store') });

const todayIso = () => new Date().toISOString().slice(0, 10);

/**
 * POST ?/create on /editor/quotes. Amounts stay text here: how many decimals they may
 * have depends on the currency, which is only known once region and store are looked up.
 * Region and currency may be left empty: they default to the store's region and its currency.
 */
export const quoteInput = z.strictObject({
	partSlug,
	storeId: id('store'),
	regionCode: z.preprocess(emptyAsUndefined, regionCode.optional()),
	currency: z.preprocess(
		emptyAsUndefined,
		z
			.string()
			.trim()
			.toUpperCase()
			.regex(/^[A-Z]{3}$/, 'Use a three-letter ISO 4217 code, e.g. EUR.')
			.optional()
	),
	amount: z
		.string({ error: 'Enter the price.' })
		.trim()
		.min(1, 'Enter the price.')
		.max(20, 'That amount is too long.'),
	shipping: z.preprocess(
		emptyAsUndefined,
		z.string().trim().max(20, 'That amount is too long.').optional()
	),
	// A checkbox posts "on" when ticked and nothing when not.
	taxIncluded: z.preprocess((v) => v === 'on' || v === 'true', z.boolean()),
	observedOn: isoDate({ missing: 'Enter the day the price was seen.' })
		.refine((d) => d >= '2000-01-01', 'Enter a date from 2000 on.')
		.refine((d) => d <= todayIso(), 'The day cannot be in the future.'),
	url: z.preprocess(emptyAsUndefined, webAddress.optional())
});
export type QuoteInput = z.infer<typeof quoteInput>;

/** POST ?/withdrawQuote on the editors' quote lists: the store no longer sells the part. */
export const withdrawQuoteInput = z.strictObject({ quoteId: id('quote') });

/** GET /editor/parts?q=&category=&page= */
export const partListQuery = z.strictObject({
	q: z.string().trim().max(100, 'Search for at most 100 characters.').default(''),
	category: z.preprocess(emptyAsUndefined, partCategory.optional()),
	page: pageNumber
});
export type PartListQuery = z.infer<typeof partListQuery>;

/** POST ?/confirm and ?/discard on /editor/parts/import. */
export const catalogImportIdInput = z.strictObject({
	importId: z.uuid({ error: 'Unknown upload.' })
});
