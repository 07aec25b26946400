import { error } from '@sveltejs/kit';
import { currentUser } from '$lib/server/auth/guards';
import * as insights from '$lib/server/services/fork-insights';
import type { PageServerLoad } from './$types';

/*
 * Fork insights: the guide's author and editors only. Anyone else, a visitor included, gets
 * the 404 of a guide that does not exist, so the page says nothing about whose guide it is.
 * That is why it lives outside the (author) group, whose area guard would answer a visitor
 * with a sign-in redirect and a reader with 403; the load below checks every request itself.
 */
export const load: PageServerLoad = async ({ params }) => {
	const outcome = await insights.guideInsights(currentUser(), params.slug);
	if (outcome.kind === 'not_found') error(404, 'Guide not found');
	return { insights: outcome.insights };
};
