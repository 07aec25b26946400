import { error } from '@sveltejs/kit';
import * as parts from '$lib/server/services/parts';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const part = await parts.getBySlug(params.slug);
	if (!part) error(404, 'Part not found');
	return { part };
};
