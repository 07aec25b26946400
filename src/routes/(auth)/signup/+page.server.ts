import { fail, redirect } from '@sveltejs/kit';
import { formFields, signUpInput } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import * as limits from '$lib/server/rate-limit';
import { addressKey } from '$lib/server/rate-limit';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as accounts from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	if (locals.user) redirect(303, '/account');
	return { sent: url.searchParams.has('sent') };
};

export const actions: Actions = {
	default: async (event) => {
		const fields = formFields(await event.request.formData());
		const input = signUpInput.safeParse(fields);
		if (!input.success) {
			return fail(400, {
				name: fields.name ?? '',
				email: fields.email ?? '',
				issues: fieldIssues(input.error)
			});
		}
		const allowed = await limits.consume('signUp', addressKey(event.getClientAddress()));
		if (!allowed.ok) return tooManyRequests(allowed);
		// The same answer whether or not the address already has an account.
		await accounts.signUp(input.data, event.url.origin);
		redirect(303, '/signup?sent');
	}
};
