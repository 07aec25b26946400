import { error } from '@sveltejs/kit';
import { regionQuery } from '$lib/schemas/guides';
import { currentUser } from '$lib/server/auth/guards';
import * as guideViews from '$lib/server/services/guide-view-cache';
import type { PageServerLoad } from './$types';

/** The guide as a sheet to print, priced in ?region= like the guide page (base region otherwise). */
export const load: PageServerLoad = async ({ params, url }) => {
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const wanted = query.success ? (query.data.region ?? null) : null;
	const viewer = currentUser();
	let outcome = await guideViews.guidePage(params.slug, wanted, viewer);
	if (outcome.kind === 'unknown_region')
		outcome = await guideViews.guidePage(params.slug, null, viewer);
	if (outcome.kind !== 'ok') error(404, 'Guide not found');
	return { guide: outcome.page.guide, disclosure: outcome.page.extras.disclosure };
};
