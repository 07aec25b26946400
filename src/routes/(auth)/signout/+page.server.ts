import { redirect } from '@sveltejs/kit';
import { signOut } from '$lib/server/auth/sign-in';
import * as accounts from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/');
	return {};
};

export const actions: Actions = {
	/** Ends the account's sessions on the server (a copied cookie stops working), then the cookie. */
	default: async (event) => {
		const user = event.locals.user;
		if (user) await accounts.endSessions(user.id);
		await signOut(event);
		redirect(303, '/');
	}
};
