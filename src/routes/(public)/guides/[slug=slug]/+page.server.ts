import { error } from '@sveltejs/kit';
import * as guides from '$lib/server/services/guides';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const guide = await guides.getPublishedBySlug(params.slug);
	if (!guide) error(404, 'Guide not found');
	return { guide };
};
