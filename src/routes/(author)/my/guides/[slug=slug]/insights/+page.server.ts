import { error } from '@sveltejs/kit';
import { currentUser } from '$lib/server/auth/guards';
import * as insights from '$lib/server/services/fork-insights';
import type { PageServerLoad } from './$types';

/** Fork insights: the guide's author and editors only; anyone else gets a 404 (not a sign-in page). */
export const load: PageServerLoad = async ({ params }) => {
	const outcome = await insights.guideInsights(currentUser(), params.slug);
	if (outcome.kind === 'not_found') error(404, 'Guide not found');
	return { insights: outcome.insights };
};
