import { requireRole } from '$lib/server/auth/guards';
import * as regions from '$lib/server/services/regions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('editor');
	return { regions: await regions.listRegions() };
};
