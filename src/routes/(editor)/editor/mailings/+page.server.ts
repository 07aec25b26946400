import { fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { createMailingInput } from '$lib/schemas/newsletter';
import { requireRole } from '$lib/server/auth/guards';
import * as mailings from '$lib/server/services/mailings';
import type { Actions, PageServerLoad } from './$types';

/*
 * Mailings: only revisions an editor has approved (a new guide, or a revision its author
 * marked major) are offered; nothing is mailed before moderation (services/mailings.ts).
 */
export const load: PageServerLoad = async () => {
	requireRole('editor');
	return mailings.listMailings();
};

export const actions: Actions = {
	create: async ({ request }) => {
		const me = requireRole('editor');
		const input = createMailingInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { issues: fieldIssues(input.error) });
		const outcome = await mailings.createMailing(me.id, input.data.revisionId);
		if (outcome.kind === 'not_found')
			return fail(404, { message: 'That revision no longer exists.' });
		if (outcome.kind === 'conflict') return fail(409, { message: outcome.message });
		if (outcome.kind === 'invalid') return fail(400, { issues: outcome.issues });
		redirect(303, `/editor/mailings/${outcome.id}`);
	}
};
