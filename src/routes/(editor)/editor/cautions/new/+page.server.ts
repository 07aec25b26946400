import { fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { CONDITION_FIELDS, ruleFromForm } from '$lib/schemas/caution-rules';
import { requireRole } from '$lib/server/auth/guards';
import * as cautions from '$lib/server/services/caution-rules';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = () => {
	requireRole('editor');
	return { fields: CONDITION_FIELDS };
};

export const actions: Actions = {
	create: async ({ request }) => {
		const me = requireRole('editor');
		const values = ruleFromForm(formFields(await request.formData()));
		const outcome = await cautions.createRule(me.id, values);
		if (outcome.kind === 'invalid') return fail(400, { issues: outcome.issues, values });
		if (outcome.kind !== 'ok')
			return fail(409, {
				issues: { _form: ['The rule could not be added.'] } as Issues,
				values
			});
		redirect(303, '/editor/cautions?done=added');
	}
};
