import { requireRole } from '$lib/server/auth/guards';
import * as reviews from '$lib/server/services/guide-reviews';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('author', 'editor');
	return { guides: await reviews.authorDashboard(user.id) };
};
