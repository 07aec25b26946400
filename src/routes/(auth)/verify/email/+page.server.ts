import { fail } from '@sveltejs/kit';
import { formFields, tokenInput } from '$lib/schemas/account';
import * as accounts from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

// Like /verify: the change happens on a button press, never on a link fetch.
export const load: PageServerLoad = ({ url }) => ({ token: url.searchParams.get('token') ?? '' });

export const actions: Actions = {
	default: async ({ request }) => {
		const input = tokenInput.safeParse(formFields(await request.formData()));
		if (!input.success)
			return fail(400, {
				message: 'This link is incomplete. Copy the whole link from the e-mail.'
			});
		const outcome = await accounts.confirmEmailChange(input.data.token);
		if (outcome === 'taken')
			return fail(409, {
				message: 'Another account took this address in the meantime. Nothing changed.'
			});
		if (outcome === 'invalid')
			return fail(400, {
				message: 'This link has expired or was already used. Ask again from your account page.'
			});
		return { changed: true };
	}
};
