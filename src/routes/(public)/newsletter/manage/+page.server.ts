import { fail } from '@sveltejs/kit';
import { fieldIssues } from '$lib/schemas/issues';
import { newsletterFields, newsletterPreferences } from '$lib/schemas/newsletter';
import { linkError, LINK_PROBLEM_TEXT } from '$lib/server/newsletter/link-problem';
import * as subscribers from '$lib/server/services/subscribers';
import type { Actions, PageServerLoad } from './$types';

/** The manage page, reached by the signed link in every mail (no account needed). */
export const load: PageServerLoad = async ({ url }) => {
	const view = await subscribers.manageView(url.searchParams.get('token'));
	if (view.kind === 'invalid') linkError(view.problem);
	const { regions } = await subscribers.preferenceChoices();
	// The forms post back with the token (their ?/action replaces the query string otherwise).
	return {
		subscription: view.subscription,
		regions,
		token: url.searchParams.get('token') ?? '',
		welcome: url.searchParams.has('welcome')
	};
};

export const actions: Actions = {
	save: async ({ request, url }) => {
		const fields = newsletterFields(await request.formData());
		const input = newsletterPreferences.safeParse(fields);
		if (!input.success) return fail(400, { fields, issues: fieldIssues(input.error) });
		const outcome = await subscribers.savePreferences(url.searchParams.get('token'), input.data);
		if (outcome.kind === 'link') return fail(400, { message: LINK_PROBLEM_TEXT[outcome.problem] });
		if (outcome.kind === 'invalid') return fail(400, { fields, issues: outcome.issues });
		return { saved: true };
	},
	unsubscribe: async ({ url }) => {
		const outcome = await subscribers.unsubscribe('manage', url.searchParams.get('token'));
		if (outcome.kind === 'invalid')
			return fail(400, { message: LINK_PROBLEM_TEXT[outcome.problem] });
		return { unsubscribed: true };
	}
};
