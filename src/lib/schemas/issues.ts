import type { z } from 'zod';

/*
 * What every operation answers, in one place: field messages (`Issues`) and the outcome a
 * service returns (`Outcome`). Services, routes, the two answer mappers
 * (server/http/answers.ts) and components import these types from here, never a copy.
 */

/** Field path (dotted, e.g. `slots.0.partId`) → its messages, as forms show them. */
export type Issues = Record<string, string[]>;

/** Key under which issues that belong to no single field (e.g. an unexpected field) are listed. */
export const FORM_ISSUES_KEY = '_form';

/**
 * A zod error as form messages: field path → its messages, in the order zod reported them.
 * Issues about the whole input go under FORM_ISSUES_KEY. Plain data, so an action can
 * return it through `fail(400, { issues })`.
 */
export function fieldIssues(error: z.ZodError): Issues {
	// A Map, then own properties: a field named "constructor" or "__proto__" (a hostile form)
	// must not meet Object.prototype's members.
	const byField = new Map<string, string[]>();
	for (const issue of error.issues) {
		const key = issue.path.length > 0 ? issue.path.map(String).join('.') : FORM_ISSUES_KEY;
		byField.set(key, [...(byField.get(key) ?? []), issue.message]);
	}
	return Object.fromEntries(byField);
}

/** Adds `more` to `issues` field by field (messages of one field keep their order). */
export function mergeIssues(issues: Issues, more: Issues): Issues {
	const merged: Issues = { ...issues };
	for (const [key, messages] of Object.entries(more))
		merged[key] = [...(merged[key] ?? []), ...messages];
	return merged;
}

/** Every message in one line, for a form that shows a single sentence. */
export function issuesSentence(issues: Issues): string {
	return Object.values(issues).flat().join(' ');
}

/** The input broke a rule: 400 with field messages on either transport. */
export type Invalid = { kind: 'invalid'; issues: Issues };
/** Nothing there for this person (or not theirs to see): 404. */
export type NotFound = { kind: 'not_found' };
/** The change clashes with what is stored: 409 with a sentence. */
export type Conflict = { kind: 'conflict'; message: string };
/** The version sent is not the stored one: 409 with the resource as it is now. */
export type Stale<C> = { kind: 'conflict'; current: C };

/** The outcomes both answer mappers turn into a failure; every other kind is a success. */
export type Failure = Invalid | NotFound | Conflict | Stale<unknown>;

/** What a change returns: ok with its data, invalid, not found or a conflict with a sentence. */
export type Outcome<T extends object = object> =
	({ kind: 'ok' } & T) | Invalid | NotFound | Conflict;

/** The same for a versioned change: a stale version answers with the stored resource. */
export type VersionedOutcome<T extends object, C> =
	({ kind: 'ok' } & T) | Invalid | NotFound | Stale<C>;

/** Parsing an input: the data, or the field messages (the same shape as a service's Invalid). */
export type Parsed<T> = { kind: 'ok'; data: T } | Invalid;

/** `schema` applied to `value` as a Parsed result. */
export function parseInput<S extends z.ZodType>(schema: S, value: unknown): Parsed<z.output<S>> {
	const parsed = schema.safeParse(value);
	return parsed.success
		? { kind: 'ok', data: parsed.data }
		: { kind: 'invalid', issues: fieldIssues(parsed.error) };
}
