import { requireRole } from '$lib/server/auth/guards';
import * as catalogReads from '$lib/server/services/catalog-reads';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('editor');
	return { counts: await catalogReads.catalogCounts() };
};
