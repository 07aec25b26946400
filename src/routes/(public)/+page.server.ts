import * as guideBrowse from '$lib/server/services/guide-browse';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	return guideBrowse.homeLists(4);
};
