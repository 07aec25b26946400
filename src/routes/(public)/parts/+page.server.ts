import { parsePartSearchLenient, PARTS_PER_PAGE } from '$lib/schemas/parts';
import * as parts from '$lib/server/services/parts';
import { partThumbs } from '$lib/server/services/photos';
import { allRegions } from '$lib/server/services/reference-cache';
import { regionSummary } from '$lib/server/services/mappers';
import type { PageServerLoad } from './$types';

/** The catalog search from the URL; a bad parameter is reported and dropped, not fatal. */
export const load: PageServerLoad = async ({ url }) => {
	const parsed = parsePartSearchLenient(url.searchParams);
	let { query } = parsed;
	const issues = { ...parsed.issues };
	let result;
	try {
		result = await parts.search({ ...query, perPage: PARTS_PER_PAGE });
	} catch (err) {
		if (!(err instanceof parts.UnknownRegionError)) throw err;
		// An unknown region is dropped like any bad parameter: the rest of the search stands.
		issues.region = [`No region has the code "${err.code}".`];
		query = { ...query, region: undefined, sort: 'name' };
		result = await parts.search({ ...query, perPage: PARTS_PER_PAGE });
	}
	return {
		query,
		issues,
		result,
		regions: (await allRegions()).map(regionSummary),
		thumbs: await partThumbs(result.items.map((p) => p.slug))
	};
};
