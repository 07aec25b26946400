import { fail } from '@sveltejs/kit';
import { linkError } from '$lib/server/newsletter/link-problem';
import { oneClickUnsubscribe } from '$lib/server/newsletter/one-click';
import * as subscribers from '$lib/server/services/subscribers';
import type { Actions, PageServerLoad } from './$types';

/*
 * The List-Unsubscribe target (RFC 2369, RFC 8058; docs/sources.md 12). GET only shows a
 * button: link scanners open URLs. POST with the body `List-Unsubscribe=One-Click` (what
 * the button sends) unsubscribes. A mail provider's POST (no Accept: text/html) goes to
 * +server.ts beside this page, which answers with plain status codes. Neither needs a
 * session or an Origin header (checkFormOrigin exempts exactly this request).
 */
export const load: PageServerLoad = async ({ url }) => {
	const view = await subscribers.unsubscribeView(url.searchParams.get('token'));
	if (view.kind === 'invalid') linkError(view.problem);
	return { subscribed: view.subscribed };
};

export const actions: Actions = {
	default: async ({ request, url }) => {
		const answer = await oneClickUnsubscribe(
			await request.formData(),
			url.searchParams.get('token')
		);
		if (answer.status !== 200) return fail(answer.status, { message: answer.message });
		return { unsubscribed: true };
	}
};
