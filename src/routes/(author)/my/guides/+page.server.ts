import { requireRole } from '$lib/server/auth/guards';
import * as reviewQueue from '$lib/server/services/review-queue';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('author', 'editor');
	return { guides: await reviewQueue.authorDashboard(user.id) };
};
