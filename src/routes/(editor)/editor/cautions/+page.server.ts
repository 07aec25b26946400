import { fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { describeCondition, ruleIdInput, ruleVersionInput } from '$lib/schemas/caution-rules';
import { requireRole } from '$lib/server/auth/guards';
import * as cautions from '$lib/server/services/caution-rules';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const rules = (await cautions.listRules()).map((r) => ({
		...r,
		conditionsText: r.conditions.map(describeCondition)
	}));
	return { rules, done: url.searchParams.get('done') };
};

type Change = 'deactivate' | 'activate' | 'delete';

/** The list's row actions: each names the rule and the version the editor saw. */
async function change(request: Request, action: Change) {
	const me = requireRole('editor');
	const fields = formFields(await request.formData());
	const id = ruleIdInput.safeParse(fields);
	const version = ruleVersionInput.safeParse(fields.version);
	if (!id.success || !version.success)
		return fail(400, { action, message: 'Unknown rule; reload the page and try again.' });
	const outcome =
		action === 'delete'
			? await cautions.deleteRule(me.id, id.data.ruleId, version.data)
			: await cautions.setActive(me.id, id.data.ruleId, version.data, action === 'activate');
	if (outcome.kind === 'not_found')
		return fail(404, { action, message: 'That rule no longer exists.' });
	if (outcome.kind === 'conflict') return fail(409, { action, message: outcome.message });
	if (outcome.kind !== 'ok')
		return fail(400, { action, message: 'The rule could not be changed.' });
	const done = { deactivate: 'deactivated', activate: 'activated', delete: 'deleted' }[action];
	redirect(303, `/editor/cautions?done=${done}`);
}

export const actions: Actions = {
	deactivate: async ({ request }) => change(request, 'deactivate'),
	activate: async ({ request }) => change(request, 'activate'),
	delete: async ({ request }) => change(request, 'delete')
};
