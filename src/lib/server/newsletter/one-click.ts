import { oneClickInput } from '$lib/schemas/newsletter';
import * as subscribers from '$lib/server/services/subscribers';
import { LINK_PROBLEM_TEXT } from './link-problem';

export type OneClickAnswer =
	{ status: 200; message: string } | { status: 400 | 404; message: string };

/**
 * The one-click unsubscribe (RFC 8058 §3.1, docs/sources.md 12), shared by the page's form
 * action (browsers) and the route's POST endpoint (mail providers): the body must be exactly
 * `List-Unsubscribe=One-Click`; the token names the subscription. A body that is not the
 * one-click request is 400; a forged token 404; a malformed, expired or replaced one 400.
 */
export async function oneClickUnsubscribe(
	form: FormData,
	token: string | null
): Promise<OneClickAnswer> {
	const body = Object.fromEntries([...form].filter(([, v]) => typeof v === 'string'));
	if (!oneClickInput.safeParse(body).success)
		return { status: 400, message: 'Send List-Unsubscribe=One-Click to unsubscribe.' };
	const outcome = await subscribers.unsubscribe('unsubscribe', token);
	if (outcome.kind === 'invalid')
		return {
			status: outcome.problem === 'forged' ? 404 : 400,
			message: LINK_PROBLEM_TEXT[outcome.problem]
		};
	return {
		status: 200,
		message: 'You are unsubscribed; no more guide mails go to this address.'
	};
}
