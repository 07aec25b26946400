import { requireUser } from '$lib/server/auth/guards';
import * as buildLists from '$lib/server/services/build-lists';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const me = requireUser();
	return { builds: await buildLists.listMine(me.id) };
};
