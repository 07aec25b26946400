import * as guides from '$lib/server/services/guides';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	return { guides: await guides.listPublished() };
};
