import { fail } from '@sveltejs/kit';
import { formFields, tokenInput } from '$lib/schemas/account';
import * as accounts from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

// Confirming takes a button press (POST): mail scanners that fetch links must not use
// the token up before the person clicks.
export const load: PageServerLoad = ({ url }) => {
	return { token: url.searchParams.get('token') ?? '' };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const input = tokenInput.safeParse(formFields(await request.formData()));
		if (!input.success)
			return fail(400, {
				message: 'This confirmation link is incomplete. Copy the whole link from the e-mail.'
			});
		const outcome = await accounts.verifyEmail(input.data.token);
		if (outcome === 'invalid') {
			return fail(400, {
				message:
					'This link has expired or was already used. Sign in, or sign up again for a new one.'
			});
		}
		return { verified: true };
	}
};
