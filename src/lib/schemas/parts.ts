import { z } from 'zod';
import { wholeNumberFromText } from './primitives';
import { pageNumber } from './query-params';
import { CATEGORY_LABELS, PART_CATEGORIES } from '../domain/types.js';
import type { PartCategory } from '../domain/types.js';
import { parseLenient, parseStrict, queryRecord, type Issues } from './query-params.js';
import {
	BOARD_FORM_FACTORS,
	MEMORY_TYPES,
	PSU_FORM_FACTORS,
	SOCKETS,
	STORAGE_FORM_FACTORS
} from './part-specs.js';

/*
 * The public catalog search (/parts and GET /api/v1/parts). Every value arrives as a URL
 * string, so numbers are coerced here. Spec filters are a small allowlist per category:
 * each names the spec field it reads and how it compares, so the service never turns a
 * request parameter into a field name or a SQL fragment.
 */

/** Parts per catalog page (page and API alike). */
export const PARTS_PER_PAGE = 24;

/**
 * Catalog orders: by brand and model, or by price in the chosen region (lowest first, parts
 * without a price there last). Prices in different currencies cannot be compared, so the
 * price sort needs a region.
 */
export const PART_SORTS = ['name', 'price'] as const;
export type PartSort = (typeof PART_SORTS)[number];
export const PART_SORT_LABELS: Record<PartSort, string> = {
	name: 'Brand and model',
	price: 'Lowest price'
};

export interface SelectFilter {
	key: SpecFilterKey;
	label: string;
	/** The spec field it reads (docs/architecture.md "Spec fields"). */
	field: string;
	/** eq: the field equals the value; includes: the field is a list holding the value. */
	op: 'eq' | 'includes';
	options: readonly string[];
}

export interface NumberFilter {
	key: SpecFilterKey;
	label: string;
	field: string;
	/** min: field ≥ value; max: field ≤ value. */
	op: 'min' | 'max';
	/** Shown beside the label; '' when the label already says it (cores). */
	unit: string;
}

export type SpecFilterDef = SelectFilter | NumberFilter;

function select(
	key: SpecFilterKey,
	label: string,
	field: string,
	options: readonly string[],
	op: 'eq' | 'includes' = 'eq'
): SelectFilter {
	return { key, label, field, op, options };
}

function numeric(
	key: SpecFilterKey,
	label: string,
	field: string,
	op: 'min' | 'max',
	unit: string
): NumberFilter {
	return { key, label, field, op, unit };
}

/** The filters each category offers; categories not listed have none. */
export const SPEC_FILTERS: Partial<Record<PartCategory, readonly SpecFilterDef[]>> = {
	cpu: [
		select('socket', 'Socket', 'socket', SOCKETS),
		numeric('minCores', 'Cores, at least', 'cores', 'min', '')
	],
	motherboard: [
		select('socket', 'Socket', 'socket', SOCKETS),
		select('formFactor', 'Form factor', 'formFactor', BOARD_FORM_FACTORS),
		select('memoryType', 'Memory type', 'memoryType', MEMORY_TYPES)
	],
	memory: [
		select('memoryType', 'Memory type', 'type', MEMORY_TYPES),
		numeric('minSpeedMts', 'Speed, at least', 'speedMts', 'min', 'MT/s')
	],
	gpu: [
		numeric('minVramGb', 'Video memory, at least', 'vramGb', 'min', 'GB'),
		numeric('maxLengthMm', 'Length, at most', 'lengthMm', 'max', 'mm')
	],
	psu: [
		numeric('minRatedW', 'Rated power, at least', 'ratedW', 'min', 'W'),
		select('formFactor', 'Form factor', 'formFactor', PSU_FORM_FACTORS)
	],
	case: [
		select(
			'boardFormFactor',
			'Takes boards of',
			'boardFormFactors',
			BOARD_FORM_FACTORS,
			'includes'
		),
		numeric('fitsGpuLengthMm', 'Fits a card of', 'maxGpuLengthMm', 'min', 'mm')
	],
	storage: [
		select('interface', 'Interface', 'interface', ['nvme', 'sata']),
		select('formFactor', 'Form factor', 'formFactor', STORAGE_FORM_FACTORS)
	]
};

// A GET form posts "" for every field left blank: that means "no filter", not a bad value.
const emptyAsUndefined = (value: unknown) =>
	typeof value === 'string' && value.trim() === '' ? undefined : value;

const choice = z.preprocess(
	emptyAsUndefined,
	z.string().trim().max(40, 'That value is too long.').optional()
);

function wholeNumber(what: string, max: number, unit: string) {
	return z.preprocess(
		emptyAsUndefined,
		z
			.preprocess(
				wholeNumberFromText,
				z
					.number({ error: `${what} must be a whole number.` })
					.int(`${what} must be a whole number.`)
					.min(1, `${what} must be at least 1.`)
					// Bounds far beyond any real part, so "a 5-metre card" is refused, not searched for.
					.max(max, `${what} must be at most ${max.toLocaleString('en-GB')} ${unit}.`)
			)
			.optional()
	);
}

/** The flat URL fields; `partSearchQuery` below adds the cross-field rules. */
export const partSearchFields = z.strictObject({
	q: z.preprocess(
		(value) => (value === undefined ? '' : value),
		z.string().trim().max(100, 'Search for at most 100 characters.')
	),
	category: z.preprocess(
		emptyAsUndefined,
		z.enum(PART_CATEGORIES, { error: `Choose one of ${PART_CATEGORIES.join(', ')}.` }).optional()
	),
	page: pageNumber,
	/** The region whose prices the catalog shows (its price column and the price sort). */
	region: z.preprocess(
		emptyAsUndefined,
		z
			.string()
			.trim()
			.toLowerCase()
			.regex(/^[a-z]{2,8}$/, 'A region code is 2–8 letters, e.g. "de".')
			.optional()
	),
	sort: z.preprocess(
		emptyAsUndefined,
		z.enum(PART_SORTS, { error: `Sort by one of: ${PART_SORTS.join(', ')}.` }).default('name')
	),
	socket: choice,
	formFactor: choice,
	memoryType: choice,
	boardFormFactor: choice,
	interface: choice,
	minCores: wholeNumber('Cores', 256, 'cores'),
	minSpeedMts: wholeNumber('Speed', 20_000, 'MT/s'),
	minVramGb: wholeNumber('Video memory', 512, 'GB'),
	maxLengthMm: wholeNumber('Length', 1_000, 'mm'),
	minRatedW: wholeNumber('Rated power', 5_000, 'W'),
	fitsGpuLengthMm: wholeNumber('Card length', 1_000, 'mm')
});

type SearchFields = z.output<typeof partSearchFields>;
export type SpecFilterKey = Exclude<
	keyof SearchFields,
	'q' | 'category' | 'page' | 'region' | 'sort'
>;
export type SpecFilters = Partial<Pick<SearchFields, SpecFilterKey>>;

const NOT_SPEC_FILTERS = new Set(['q', 'category', 'page', 'region', 'sort']);
export const SPEC_FILTER_KEYS = Object.keys(partSearchFields.shape).filter(
	(key) => !NOT_SPEC_FILTERS.has(key)
) as SpecFilterKey[];

/** Which categories offer a filter, for the message when it is used elsewhere. */
function categoriesWith(key: SpecFilterKey): string {
	const names = Object.entries(SPEC_FILTERS)
		.filter(([, defs]) => defs?.some((d) => d.key === key))
		.map(([category]) => CATEGORY_LABELS[category as PartCategory].toLowerCase());
	return names.join(' and ');
}

/** GET /parts and /api/v1/parts: `{ q, category, page, specFilters }`. */
export const partSearchQuery = partSearchFields
	.superRefine((input, ctx) => {
		if (input.sort === 'price' && !input.region) {
			ctx.addIssue({
				code: 'custom',
				path: ['sort'],
				message: 'Choose a region to sort by price: prices are compared in its currency.'
			});
		}
		const defs = input.category ? (SPEC_FILTERS[input.category] ?? []) : [];
		for (const key of SPEC_FILTER_KEYS) {
			const value = input[key];
			if (value === undefined) continue;
			const def = defs.find((d) => d.key === key);
			if (!def) {
				ctx.addIssue({
					code: 'custom',
					path: [key],
					message: `The ${key} filter applies to ${categoriesWith(key)} only; choose that category first.`
				});
			} else if ('options' in def && !def.options.includes(String(value))) {
				ctx.addIssue({
					code: 'custom',
					path: [key],
					message: `Choose one of ${def.options.join(', ')}.`
				});
			}
		}
	})
	.transform(({ q, category, page, region, sort, ...rest }) => {
		const specFilters: SpecFilters = {};
		for (const key of SPEC_FILTER_KEYS) {
			if (rest[key] !== undefined) Object.assign(specFilters, { [key]: rest[key] });
		}
		return { q, category, page, region, sort, specFilters };
	});
export type PartSearchQuery = z.output<typeof partSearchQuery>;

/**
 * Strict parse for the API: any unknown or repeated parameter, bad value or filter outside
 * the chosen category fails with field issues.
 */
export function parsePartSearchStrict(
	params: URLSearchParams
): { ok: true; query: PartSearchQuery } | { ok: false; issues: Issues } {
	const { raw, repeated } = queryRecord(params);
	return parseStrict(partSearchQuery, raw, repeated);
}

/**
 * Lenient parse for the page: each bad or unknown parameter is reported and dropped, so
 * one typo in the address does not lose the rest of the search.
 */
export function parsePartSearchLenient(params: URLSearchParams): {
	query: PartSearchQuery;
	issues: Issues;
} {
	const { raw, repeated } = queryRecord(params);
	return parseLenient(partSearchQuery, Object.keys(partSearchFields.shape), raw, repeated);
}
