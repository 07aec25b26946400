import { waitingCounts } from '$lib/server/services/editor-waiting';
import type { LayoutServerLoad } from './$types';

/*
 * The editor tabs carry counts of what waits (reviews, reports, sightings, author requests).
 * Only editors and admins get them; each page still checks the role itself.
 */
export const load: LayoutServerLoad = async ({ locals }) => {
	const role = locals.user?.role;
	if (role !== 'editor' && role !== 'admin') return { waiting: null };
	return { waiting: await waitingCounts() };
};
