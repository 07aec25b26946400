import { error } from '@sveltejs/kit';
import { regionQuery } from '$lib/schemas/guides';
import { currentUser } from '$lib/server/auth/guards';
import * as guides from '$lib/server/services/guides';
import type { PageServerLoad } from './$types';

/** The guide as a sheet to print, priced in ?region= like the guide page (base region otherwise). */
export const load: PageServerLoad = async ({ params, url }) => {
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const wanted = query.success ? (query.data.region ?? null) : null;
	const viewer = currentUser();
	let outcome = await guides.getGuidePage(params.slug, wanted, undefined, viewer);
	if (outcome.kind === 'unknown_region')
		outcome = await guides.getGuidePage(params.slug, null, undefined, viewer);
	if (outcome.kind !== 'ok') error(404, 'Guide not found');
	return { guide: outcome.page.guide, disclosure: outcome.page.extras.disclosure };
};
