import { unreadCount } from '$lib/server/services/notices';
import type { LayoutServerLoad } from './$types';

/** Only what the header needs: who is signed in, their role, and their unread notices. */
export const load: LayoutServerLoad = async ({ locals }) => {
	const user = locals.user;
	if (!user) return { viewer: null };
	return {
		viewer: { name: user.name ?? user.email, role: user.role, unread: await unreadCount(user.id) }
	};
};
