import { json } from '@sveltejs/kit';
import { regionQuery } from '$lib/schemas/guides';
import { fieldIssues } from '$lib/schemas/issues';
import * as guides from '$lib/server/services/guides';
import type { RequestHandler } from './$types';

/** A published guide priced in a region: totals, range and each line quoted or estimated. */
export const GET: RequestHandler = async ({ params, url }) => {
	const query = regionQuery.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success)
		return json({ message: 'Check the query.', issues: fieldIssues(query.error) }, { status: 400 });
	const outcome = await guides.getPriced(params.slug, query.data.region ?? null);
	if (outcome.kind === 'not_found') return json({ message: 'Guide not found' }, { status: 404 });
	if (outcome.kind === 'unknown_region') {
		return json(
			{ message: 'Unknown region', issues: { region: [`No region "${query.data.region}".`] } },
			{ status: 400 }
		);
	}
	return json(outcome.guide);
};
