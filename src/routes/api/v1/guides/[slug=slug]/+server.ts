import { json } from '@sveltejs/kit';
import { regionQuery } from '$lib/schemas/guides';
import { fieldIssues } from '$lib/schemas/issues';
import * as guideViews from '$lib/server/services/guide-view-cache';
import type { RequestHandler } from './$types';

/** GET /api/v1/guides/[slug]?region=xx: the published guide, priced in its base region or `region`. */
export const GET: RequestHandler = async ({ params, url }) => {
	const query = regionQuery.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success)
		return json({ message: 'Check the query.', issues: fieldIssues(query.error) }, { status: 400 });
	const outcome = await guideViews.priced(params.slug, query.data.region ?? null);
	if (outcome.kind === 'not_found') return json({ message: 'Guide not found' }, { status: 404 });
	if (outcome.kind === 'unknown_region') {
		return json(
			{ message: 'Unknown region', issues: { region: [`No region "${query.data.region}".`] } },
			{ status: 400 }
		);
	}
	return json(outcome.guide);
};
