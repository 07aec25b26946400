import { requireRole } from '$lib/server/auth/guards';
import * as guides from '$lib/server/services/guides';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('author', 'editor');
	return { guides: await guides.listByAuthor(user.id) };
};
