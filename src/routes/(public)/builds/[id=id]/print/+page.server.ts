import { error } from '@sveltejs/kit';
import { currentUser } from '$lib/server/auth/guards';
import * as buildView from '$lib/server/services/build-view';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const viewer = currentUser();
	const build = await buildView.getBuild(viewer ? { id: viewer.id } : null, Number(params.id), {
		shareToken: url.searchParams.get('key') ?? undefined
	});
	if (!build) error(404, 'Build not found');
	return { build };
};
