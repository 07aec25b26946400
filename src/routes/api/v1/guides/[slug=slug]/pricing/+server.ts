import { json } from '@sveltejs/kit';
import { regionQuery } from '$lib/schemas/guides';
import { fieldIssues } from '$lib/schemas/issues';
import { cachingHeaders } from '$lib/server/http/guide-caching';
import * as guideViews from '$lib/server/services/guide-view-cache';
import type { RequestHandler } from './$types';

/** A published guide priced in a region: totals, range and each line quoted or estimated. */
export const GET: RequestHandler = async ({ params, url, locals, setHeaders }) => {
	const query = regionQuery.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success)
		return json({ message: 'Check the query.', issues: fieldIssues(query.error) }, { status: 400 });
	// From the cached view, with the stamp the caching hook read (http/guide-caching.ts).
	const outcome = await guideViews.priced(
		params.slug,
		query.data.region ?? null,
		locals.guideStamp
	);
	if (outcome.kind === 'not_found') return json({ message: 'Guide not found' }, { status: 404 });
	if (outcome.kind === 'unknown_region') {
		return json(
			{ message: 'Unknown region', issues: { region: [`No region "${query.data.region}".`] } },
			{ status: 400 }
		);
	}
	setHeaders(cachingHeaders(locals));
	return json(outcome.guide);
};
