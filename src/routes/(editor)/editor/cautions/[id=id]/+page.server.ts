import { error, fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { CONDITION_FIELDS, ruleFromForm, ruleVersionInput } from '$lib/schemas/caution-rules';
import { requireRole } from '$lib/server/auth/guards';
import * as cautions from '$lib/server/services/caution-rules';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = async ({ params }) => {
	requireRole('editor');
	const rule = await cautions.getRule(Number(params.id));
	if (!rule) error(404, 'No such caution rule.');
	return { rule, fields: CONDITION_FIELDS };
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const values = ruleFromForm(fields);
		const version = ruleVersionInput.safeParse(fields.version);
		if (!version.success)
			return fail(400, { issues: { _form: ['Reload the page and try again.'] } as Issues, values });
		const outcome = await cautions.updateRule(me.id, Number(params.id), version.data, values);
		if (outcome.kind === 'invalid') return fail(400, { issues: outcome.issues, values });
		if (outcome.kind === 'not_found')
			return fail(404, { issues: { _form: ['That rule no longer exists.'] } as Issues, values });
		if (outcome.kind === 'conflict')
			return fail(409, { issues: { _form: [outcome.message] } as Issues, values });
		redirect(303, '/editor/cautions?done=saved');
	}
};
