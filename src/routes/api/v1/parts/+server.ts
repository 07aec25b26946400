import { json } from '@sveltejs/kit';
import { parsePartSearchStrict, PARTS_PER_PAGE } from '$lib/schemas/parts';
import * as parts from '$lib/server/services/parts';
import type { PartSearchResult } from '$lib/views';
import type { RequestHandler } from './$types';

/** GET /api/v1/parts?q=&category=&region=&sort=&page=&<spec filters> → PartSearchResult. */
export const GET: RequestHandler = async ({ url }) => {
	const parsed = parsePartSearchStrict(url.searchParams);
	if (!parsed.ok) {
		return json(
			{ message: 'The search parameters are not valid.', issues: parsed.issues },
			{ status: 400 }
		);
	}
	try {
		const result: PartSearchResult = await parts.search({
			...parsed.query,
			perPage: PARTS_PER_PAGE
		});
		return json(result);
	} catch (err) {
		if (!(err instanceof parts.UnknownRegionError)) throw err;
		return json(
			{
				message: 'The search parameters are not valid.',
				issues: { region: [`No region has the code "${err.code}".`] }
			},
			{ status: 400 }
		);
	}
};
