import { z } from 'zod';
import { wholeNumberFromText } from './primitives';
import { fieldIssues, type Issues } from './issues.js';

/*
 * Search queries from the URL, parsed two ways: strictly for the JSON API (anything wrong
 * is a 400 with field issues) and leniently for pages (each bad parameter is reported and
 * dropped, so one typo in an address does not lose the rest of the search).
 */

export type { Issues } from './issues.js';

/**
 * URL parameters as a record. Keys in `listKeys` collect every value (blank ones dropped);
 * any other key given twice keeps its last value and is reported as repeated.
 */
export function queryRecord(
	params: URLSearchParams,
	listKeys: readonly string[] = []
): { raw: Record<string, unknown>; repeated: string[] } {
	const raw: Record<string, unknown> = {};
	const repeated = new Set<string>();
	for (const [key, value] of params) {
		if (listKeys.includes(key)) {
			if (value.trim() !== '') ((raw[key] ??= []) as string[]).push(value);
			continue;
		}
		if (key in raw) repeated.add(key);
		raw[key] = value;
	}
	return { raw, repeated: [...repeated] };
}

/** Any unknown or repeated parameter or bad value fails with field issues. */
export function parseStrict<S extends z.ZodType>(
	schema: S,
	raw: Record<string, unknown>,
	repeated: readonly string[]
): { ok: true; query: z.output<S> } | { ok: false; issues: Issues } {
	const parsed = schema.safeParse(raw);
	const issues = parsed.success ? {} : fieldIssues(parsed.error);
	for (const key of repeated) (issues[key] ??= []).unshift(`Give ${key} only once.`);
	if (parsed.success && repeated.length === 0) return { ok: true, query: parsed.data };
	return { ok: false, issues };
}

/**
 * Each bad or unknown parameter is reported (array items under their field) and dropped.
 * Dropping one can make another invalid (a filter whose category was bad), hence a few rounds.
 */
export function parseLenient<S extends z.ZodType>(
	schema: S,
	knownKeys: readonly string[],
	raw: Record<string, unknown>,
	repeated: readonly string[]
): { query: z.output<S>; issues: Issues } {
	const issues: Issues = {};
	for (const key of repeated)
		(issues[key] ??= []).push(`${key} was given more than once; the last value is used.`);
	let input = raw;
	for (let round = 0; round < 4; round++) {
		const parsed = schema.safeParse(input);
		if (parsed.success) return { query: parsed.data, issues };
		const found = fieldIssues(parsed.error);
		const bad = new Set<string>();
		for (const [key, messages] of Object.entries(found)) {
			const field = key.split('.')[0] ?? key;
			bad.add(field);
			(issues[field] ??= []).push(...messages);
		}
		input = Object.fromEntries(
			Object.entries(input).filter(([key]) => knownKeys.includes(key) && !bad.has(key))
		);
	}
	return { query: schema.parse({}), issues };
}

/** ?page=: a whole number from 1 (blank means 1), the same wording on every paged list. */
export const pageNumber = z.preprocess(
	(value) => (typeof value === 'string' && value.trim() === '' ? undefined : value),
	z
		.preprocess(
			wholeNumberFromText,
			z
				.number({ error: 'The page must be a whole number.' })
				.int('The page must be a whole number.')
				.min(1, 'Pages start at 1.')
				.max(100_000, 'There are not that many pages.')
		)
		.default(1)
);
