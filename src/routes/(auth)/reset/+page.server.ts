import { fail, redirect } from '@sveltejs/kit';
import { formFields, passwordResetRequestInput } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import * as limits from '$lib/server/rate-limit';
import { passwordResetChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as accounts from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => ({ sent: url.searchParams.has('sent') });

export const actions: Actions = {
	default: async (event) => {
		const fields = formFields(await event.request.formData());
		const input = passwordResetRequestInput.safeParse(fields);
		if (!input.success)
			return fail(400, { email: fields.email ?? '', issues: fieldIssues(input.error) });
		const allowed = await limits.consumeAll(
			passwordResetChecks(event.getClientAddress(), input.data.email)
		);
		if (!allowed.ok) return tooManyRequests(allowed);
		await accounts.requestPasswordReset(input.data.email, event.url.origin);
		redirect(303, '/reset?sent');
	}
};
