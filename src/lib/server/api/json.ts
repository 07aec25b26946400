/*
 * What every JSON API handler answers the same way: reading and validating a JSON body,
 * 400 with field issues, 404 without data, 409 with the stored state.
 */
import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldIssues } from '$lib/schemas/issues';
import type { Issues } from '$lib/schemas/issues';

export type Read<T> = { ok: true; data: T } | { ok: false; response: Response };

/** The request's JSON body checked against `schema`: its data, or the 400 to send back. */
export async function readJson<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<Read<z.output<S>>> {
	let value: unknown;
	try {
		value = await request.json();
	} catch {
		return {
			ok: false,
			response: json({ message: 'The body is not valid JSON.' }, { status: 400 })
		};
	}
	const parsed = schema.safeParse(value);
	if (!parsed.success) return { ok: false, response: invalid(fieldIssues(parsed.error)) };
	return { ok: true, data: parsed.data };
}

export const invalid = (issues: Issues) =>
	json({ message: 'Check the highlighted fields.', issues }, { status: 400 });

export const notFound = (message: string) => json({ message }, { status: 404 });

/** 409: someone changed it since the client's `version`; `current` is what is stored now. */
export const stale = (message: string, current: unknown) =>
	json({ message, current }, { status: 409 });
