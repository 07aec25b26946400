import { fail } from '@sveltejs/kit';
import { oneClickInput } from '$lib/schemas/newsletter';
import { linkError, LINK_PROBLEM_TEXT } from '$lib/server/newsletter/link-problem';
import * as subscribers from '$lib/server/services/subscribers';
import type { Actions, PageServerLoad } from './$types';

/*
 * The List-Unsubscribe target (RFC 2369, RFC 8058; docs/sources.md 12). GET only shows a
 * button: link scanners open URLs. POST with the body `List-Unsubscribe=One-Click` (what
 * mail providers send, and what the button sends) unsubscribes, with no session and no
 * Origin header (checkFormOrigin exempts this route and nothing else).
 */
export const load: PageServerLoad = async ({ url }) => {
	const view = await subscribers.unsubscribeView(url.searchParams.get('token'));
	if (view.kind === 'invalid') linkError(view.problem);
	return { subscribed: view.subscribed };
};

export const actions: Actions = {
	default: async ({ request, url }) => {
		const body = Object.fromEntries(
			[...(await request.formData())].filter(([, v]) => typeof v === 'string')
		);
		if (!oneClickInput.safeParse(body).success)
			return fail(400, { message: 'Send List-Unsubscribe=One-Click to unsubscribe.' });
		const outcome = await subscribers.unsubscribe('unsubscribe', url.searchParams.get('token'));
		if (outcome.kind === 'invalid')
			return fail(outcome.problem === 'forged' ? 404 : 400, {
				message: LINK_PROBLEM_TEXT[outcome.problem]
			});
		return { unsubscribed: true };
	}
};
