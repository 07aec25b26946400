import { z } from 'zod';
import { wholeNumberFromText } from './primitives';
import { pageNumber } from './query-params';
import { parseLenient, parseStrict, queryRecord, type Issues } from './query-params.js';

/*
 * Guide browse (/guides and GET /api/v1/guides). Every value arrives as a URL string. The
 * budget is in whole units of the reader's chosen region's currency and is compared with
 * each guide's picks total priced in that region, so a budget, a "lowest total" or a "best
 * value" sort needs a region: totals in different currencies cannot be compared.
 */

/** Guides per browse page (page and API alike). */
export const GUIDES_PER_PAGE = 12;

/**
 * Sorts on offer. "Best value" is the guide page's FPS per 100 units of the chosen region's
 * currency (domain/value.ts): highest first, guides without frame results or without a
 * complete total last.
 */
export const GUIDE_SORTS = ['newest', 'total', 'value'] as const;
export type GuideSort = (typeof GUIDE_SORTS)[number];
export const GUIDE_SORT_LABELS: Record<GuideSort, string> = {
	newest: 'Newest',
	total: 'Lowest total',
	value: 'Best value'
};
/** Sorts that compare totals, so need the reader's region. */
const SORTS_NEEDING_REGION: Record<GuideSort, string | null> = {
	newest: null,
	total: 'total',
	value: 'value'
};

// A GET form sends "" for a field left blank: that means "no filter", not a bad value.
const emptyAsUndefined = (value: unknown) =>
	typeof value === 'string' && value.trim() === '' ? undefined : value;

const regionCode = z.preprocess(
	emptyAsUndefined,
	z
		.string()
		.trim()
		.toLowerCase()
		.regex(/^[a-z]{2,8}$/, 'A region code is 2–8 letters, e.g. "de".')
		.optional()
);

function budget(which: string) {
	return z.preprocess(
		emptyAsUndefined,
		z
			.preprocess(
				wholeNumberFromText,
				z
					.number({ error: `The ${which} budget must be a whole number.` })
					.int(`The ${which} budget must be a whole number.`)
					.min(0, `The ${which} budget cannot be negative.`)
					// Far beyond any PC build in any currency we price (JPY included).
					.max(100_000_000, `The ${which} budget is too large.`)
			)
			.optional()
	);
}

const tag = z
	.string()
	.trim()
	.toLowerCase()
	.regex(/^[a-z0-9][a-z0-9-]{0,39}$/, 'A tag is up to 40 lower-case letters, digits and dashes.');

/** The URL fields; `guideBrowseQuery` adds the cross-field rules. `tag` may repeat. */
export const guideBrowseFields = z.strictObject({
	/** Words to find in the published guide's title, summary or build notes. */
	q: z.preprocess(
		emptyAsUndefined,
		z.string().trim().max(100, 'Search for at most 100 characters.').optional()
	),
	region: regionCode,
	base: regionCode,
	min: budget('lowest'),
	max: budget('highest'),
	tag: z.array(tag).max(10, 'Choose at most 10 tags.').default([]),
	sort: z.preprocess(
		emptyAsUndefined,
		z.enum(GUIDE_SORTS, { error: `Sort by one of: ${GUIDE_SORTS.join(', ')}.` }).default('newest')
	),
	page: pageNumber
});

export const guideBrowseQuery = guideBrowseFields.superRefine((input, ctx) => {
	const needsRegion = 'Choose the region your budget is in: totals are compared in its currency.';
	if (!input.region) {
		if (input.min !== undefined)
			ctx.addIssue({ code: 'custom', path: ['min'], message: needsRegion });
		if (input.max !== undefined)
			ctx.addIssue({ code: 'custom', path: ['max'], message: needsRegion });
		const sortBy = SORTS_NEEDING_REGION[input.sort];
		if (sortBy) {
			ctx.addIssue({
				code: 'custom',
				path: ['sort'],
				message: `Choose a region to sort by ${sortBy}: totals are compared in its currency.`
			});
		}
	}
	if (input.min !== undefined && input.max !== undefined && input.min > input.max) {
		ctx.addIssue({
			code: 'custom',
			path: ['max'],
			message: 'The highest budget must be at least the lowest.'
		});
	}
});
export type GuideBrowseQuery = z.output<typeof guideBrowseQuery>;

/** Strict parse for the API: any unknown or repeated parameter or bad value fails with field issues. */
export function parseGuideBrowseStrict(
	params: URLSearchParams
): { ok: true; query: GuideBrowseQuery } | { ok: false; issues: Issues } {
	const { raw, repeated } = queryRecord(params, ['tag']);
	return parseStrict(guideBrowseQuery, raw, repeated);
}

/**
 * Lenient parse for the page: each bad or unknown parameter is reported and dropped, so one
 * typo does not lose the rest of the search. A bad tag drops the tag filter as a whole.
 */
export function parseGuideBrowseLenient(params: URLSearchParams): {
	query: GuideBrowseQuery;
	issues: Issues;
} {
	const { raw, repeated } = queryRecord(params, ['tag']);
	return parseLenient(guideBrowseQuery, Object.keys(guideBrowseFields.shape), raw, repeated);
}
