import { requireRole } from '$lib/server/auth/guards';
import * as upkeep from '$lib/server/services/catalog-upkeep';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('editor');
	return { counts: await upkeep.catalogCounts() };
};
