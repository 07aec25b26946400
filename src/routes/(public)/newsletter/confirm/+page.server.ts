import { fail, redirect } from '@sveltejs/kit';
import { linkError, LINK_PROBLEM_TEXT } from '$lib/server/newsletter/link-problem';
import * as subscribers from '$lib/server/services/subscribers';
import type { Actions, PageServerLoad } from './$types';

/*
 * The double opt-in link. Opening it changes nothing (mail scanners open links too); the
 * button's POST starts the subscription.
 */
export const load: PageServerLoad = async ({ url }) => {
	const token = url.searchParams.get('token');
	const check = await subscribers.checkConfirmLink(token);
	if (check.kind === 'invalid') linkError(check.problem);
	return { token };
};

export const actions: Actions = {
	default: async ({ url }) => {
		const outcome = await subscribers.confirm(url.searchParams.get('token'), url.origin);
		if (outcome.kind === 'invalid')
			return fail(outcome.problem === 'forged' ? 404 : 400, {
				message: LINK_PROBLEM_TEXT[outcome.problem]
			});
		// On to the manage page: this link is spent, so its own page would now refuse it.
		redirect(303, `${outcome.manageUrl}&welcome`);
	}
};
