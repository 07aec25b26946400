import { parsePartSearchLenient, PARTS_PER_PAGE } from '$lib/schemas/parts';
import * as parts from '$lib/server/services/parts';
import { partThumbs } from '$lib/server/services/photos';
import type { PageServerLoad } from './$types';

/** The catalog search from the URL; a bad parameter is reported and dropped, not fatal. */
export const load: PageServerLoad = async ({ url }) => {
	const { query, issues } = parsePartSearchLenient(url.searchParams);
	const result = await parts.search({ ...query, perPage: PARTS_PER_PAGE });
	return { query, issues, result, thumbs: await partThumbs(result.items.map((p) => p.slug)) };
};
