import { fail, redirect } from '@sveltejs/kit';
import { formFields, passwordResetInput, tokenInput } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import * as accounts from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const token = tokenInput.safeParse({ token: params.token });
	return { usable: token.success && (await accounts.isResetTokenUsable(token.data.token)) };
};

export const actions: Actions = {
	default: async ({ params, request }) => {
		const token = tokenInput.safeParse({ token: params.token });
		const input = passwordResetInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { issues: fieldIssues(input.error) });
		if (
			!token.success ||
			(await accounts.resetPassword(token.data.token, input.data.password)) === 'invalid'
		) {
			return fail(400, {
				message: 'This reset link has expired or was already used. Ask for a new one.'
			});
		}
		redirect(303, '/signin?changed');
	}
};
