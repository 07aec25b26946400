import { error } from '@sveltejs/kit';
import { regionQuery } from '$lib/schemas/guides';
import * as guides from '$lib/server/services/guides';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	// ?region=xx works without JavaScript; a bad or unknown code falls back to the base region.
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const wanted = query.success ? (query.data.region ?? null) : null;
	let outcome = await guides.getPriced(params.slug, wanted);
	let regionProblem = query.success ? null : 'That is not a region code.';
	if (outcome.kind === 'unknown_region') {
		regionProblem = `We have no region “${wanted}”. Showing the guide's base region.`;
		outcome = await guides.getPriced(params.slug, null);
	}
	if (outcome.kind !== 'ok') error(404, 'Guide not found');
	return { guide: outcome.guide, regionProblem };
};
