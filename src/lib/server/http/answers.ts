/*
 * How a request's input is read and how an operation's outcome becomes an answer, once per
 * transport. Routes stay thin: read with one schema (readJson / parseForm), call one
 * service, and hand the outcome to jsonAnswer or a page's formAnswers. The failures every
 * outcome shares (schemas/issues.ts) always answer the same way:
 *
 *   outcome                      JSON API                              form action
 *   invalid { issues }           400 { message, issues }               fail(400, the page's invalid(issues))
 *   not_found                    404 { message }                       error(404, message), or fail(404, …)
 *   conflict { message }         409 { message }                       fail(409, the page's conflict(outcome))
 *   conflict { current } (stale) 409 { message, current }              fail(409, the page's conflict(outcome))
 *   anything else (success)      what `done` answers (200, 201 …)      what `done` returns (data or a redirect)
 *
 * Only `done` and the page's words differ between operations.
 */
import { error, fail, json } from '@sveltejs/kit';
import type { ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';
import { FormReader } from '$lib/schemas/form-data';
import { parseInput } from '$lib/schemas/issues';
import type { Conflict, Failure, Issues, Parsed, Stale } from '$lib/schemas/issues';

type Kind = { kind: string };

/** The outcomes of an operation that are not shared failures: each operation answers these itself. */
export type Success<O extends Kind> = Exclude<O, Failure>;

function isFailure(outcome: Kind): outcome is Failure {
	return outcome.kind === 'invalid' || outcome.kind === 'not_found' || outcome.kind === 'conflict';
}

// ---------------------------------------------------------------------------------------------
// Reading input
// ---------------------------------------------------------------------------------------------

/** The body is not JSON at all: 400 before any field can be judged. */
export type BadJson = { kind: 'bad_json' };

export interface ReadJsonOptions {
	/** What an empty body stands for (a fork takes none); without it an empty body is bad JSON. */
	empty?: unknown;
	/** Applied to the body before the schema: a path parameter merged in, read-only fields dropped. */
	prepare?: (body: unknown) => unknown;
}

/** The request's JSON body checked against `schema`. */
export async function readJson<S extends z.ZodType>(
	request: Request,
	schema: S,
	options: ReadJsonOptions = {}
): Promise<Parsed<z.output<S>> | BadJson> {
	const text = await request.text();
	let body: unknown;
	if (options.empty !== undefined && text.trim() === '') body = options.empty;
	else {
		try {
			body = JSON.parse(text);
		} catch {
			return { kind: 'bad_json' };
		}
	}
	return parseInput(schema, options.prepare ? options.prepare(body) : body);
}

/** The posted form (an action reads it once; address fields such as a slot id come from it too). */
export async function readFormData(request: Request): Promise<FormReader> {
	return new FormReader(await request.formData());
}

/**
 * A posted form read into the JSON shape of `schema` by `read` (schemas/form-data.ts), then
 * parsed with that same schema, so its messages are the JSON API's.
 */
export function parseForm<S extends z.ZodType>(
	form: FormReader,
	schema: S,
	read: (form: FormReader) => unknown
): Parsed<z.output<S>> {
	return parseInput(schema, read(form));
}

// ---------------------------------------------------------------------------------------------
// JSON answers
// ---------------------------------------------------------------------------------------------

export const CHECK_FIELDS = 'Check the highlighted fields.';

/** An operation's own words in its JSON failures. */
export interface JsonWords {
	/** The 404 message ("Build not found"). */
	notFound: string;
	/** The 409 message when the version sent is stale (the answer carries `current`). */
	stale?: string;
}

/** A shared failure (or a body that is not JSON) as the JSON API answers it. */
export function jsonFailure(failure: Failure | BadJson, words: JsonWords): Response {
	switch (failure.kind) {
		case 'bad_json':
			return json({ message: 'The body is not valid JSON.' }, { status: 400 });
		case 'invalid':
			return json({ message: CHECK_FIELDS, issues: failure.issues }, { status: 400 });
		case 'not_found':
			return json({ message: words.notFound }, { status: 404 });
		case 'conflict':
			return 'current' in failure
				? json(
						{
							message: words.stale ?? 'Changed elsewhere since you read it.',
							current: failure.current
						},
						{ status: 409 }
					)
				: json({ message: failure.message }, { status: 409 });
	}
}

/** The JSON answer to an outcome: shared failures as above, anything else as `done` says. */
export function jsonAnswer<O extends Kind>(
	outcome: O,
	words: JsonWords,
	done: (ok: Success<O>) => Response
): Response {
	return isFailure(outcome) ? jsonFailure(outcome, words) : done(outcome as Success<O>);
}

// ---------------------------------------------------------------------------------------------
// Form answers
// ---------------------------------------------------------------------------------------------

type Data = Record<string, unknown>;

/** How one page shows the shared failures: the data its `form` prop gets back. */
export interface FormWords<I extends Data, C extends Data, N extends Data> {
	/** A message for error(404, …), or the data of fail(404, …) for a form that stays on its page. */
	notFound: string | (() => N);
	/** The data of fail(400, …) for field messages. */
	invalid: (issues: Issues) => I;
	/** The data of fail(409, …). */
	conflict: (outcome: Conflict | Stale<unknown>) => C;
}

/**
 * One page's mapper from outcome to action answer. `failure` answers a parse failure or a
 * failed outcome; `answer` answers any outcome, passing successes to `done` (which returns
 * the page's data or throws a redirect).
 */
export function formAnswers<I extends Data, C extends Data, N extends Data = never>(
	words: FormWords<I, C, N>
) {
	function failure(outcome: Failure): ActionFailure<I> | ActionFailure<C> | ActionFailure<N> {
		switch (outcome.kind) {
			case 'invalid':
				return fail(400, words.invalid(outcome.issues));
			case 'not_found':
				if (typeof words.notFound === 'string') error(404, words.notFound);
				return fail(404, words.notFound());
			case 'conflict':
				return fail(409, words.conflict(outcome));
		}
	}
	function answer<O extends Kind, R>(
		outcome: O,
		done: (ok: Success<O>) => R
	): R | ActionFailure<I> | ActionFailure<C> | ActionFailure<N> {
		return isFailure(outcome) ? failure(outcome) : done(outcome as Success<O>);
	}
	return { failure, answer };
}
