import { requireRole } from '$lib/server/auth/guards';
import * as regionReads from '$lib/server/services/region-reads';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('editor');
	return { regions: await regionReads.listRegions() };
};
