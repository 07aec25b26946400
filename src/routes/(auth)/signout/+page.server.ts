import { redirect } from '@sveltejs/kit';
import { signOut } from '$lib/server/auth/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/');
	return {};
};

export const actions: Actions = {
	default: async (event) => {
		await signOut(event);
		redirect(303, '/');
	}
};
