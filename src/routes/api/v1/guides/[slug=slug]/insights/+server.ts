import { json } from '@sveltejs/kit';
import { currentUser } from '$lib/server/auth/guards';
import { jsonAnswer } from '$lib/server/http/answers';
import * as insights from '$lib/server/services/fork-insights';
import type { RequestHandler } from './$types';

/**
 * Fork insights of a guide, for its author and editors. Everyone else, signed in or not,
 * gets the same 404 as for a guide that does not exist: the page reveals nothing.
 */
export const GET: RequestHandler = async ({ params }) => {
	const outcome = await insights.guideInsights(currentUser(), params.slug);
	return jsonAnswer(outcome, { notFound: 'Guide not found' }, (ok) => json(ok.insights));
};
