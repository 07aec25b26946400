import { requireUser } from '$lib/server/auth/guards';
import * as builds from '$lib/server/services/builds';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const me = requireUser();
	return { builds: await builds.listMine(me.id) };
};
