import { json } from '@sveltejs/kit';
import { fitInput } from '$lib/schemas/fit';
import { fieldIssues } from '$lib/schemas/issues';
import * as fit from '$lib/server/services/fit';
import type { RequestHandler } from './$types';

/** Public: checking a list of parts reveals nothing private and changes nothing. */
export const POST: RequestHandler = async ({ request }) => {
	let body: unknown;
	try {
		body = await request.json();
	} catch {
		return json({ message: 'The body is not valid JSON.' }, { status: 400 });
	}
	const input = fitInput.safeParse(body);
	if (!input.success)
		return json({ message: 'Check the slots.', issues: fieldIssues(input.error) }, { status: 400 });
	const outcome = await fit.check(input.data);
	if (outcome.kind === 'invalid')
		return json({ message: 'Check the slots.', issues: outcome.issues }, { status: 400 });
	return json(outcome.result);
};
