import type { LayoutServerLoad } from './$types';

/** Only what the header needs: who is signed in and their role. */
export const load: LayoutServerLoad = ({ locals }) => {
	const user = locals.user;
	return { viewer: user ? { name: user.name ?? user.email, role: user.role } : null };
};
