import { fail, redirect } from '@sveltejs/kit';
import {
	formFields,
	linkSignInInput,
	passwordSignInInput,
	redirectTarget
} from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { sendSignInLinkLater, signInWithPassword } from '$lib/server/auth/sign-in';
import * as limits from '$lib/server/rate-limit';
import { emailLinkChecks, signInChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import type { Actions, PageServerLoad } from './$types';

/** One message for unknown address, wrong password, unconfirmed or disabled account. */
const REFUSED =
	'That e-mail and password do not match an account we can sign in. Check both, or use a sign-in link.';

export const load: PageServerLoad = ({ locals, url }) => {
	const redirectTo = redirectTarget.parse(url.searchParams.get('redirectTo') ?? '/');
	if (locals.user) redirect(303, redirectTo);
	// Auth.js sends link failures (expired or used links) back here with ?error=.
	const linkError = url.searchParams.get('error') === 'Verification';
	return { redirectTo, linkError, changed: url.searchParams.has('changed') };
};

export const actions: Actions = {
	password: async (event) => {
		const fields = formFields(await event.request.formData());
		const input = passwordSignInInput.safeParse(fields);
		if (!input.success)
			return fail(400, {
				form: 'password',
				email: fields.email ?? '',
				issues: fieldIssues(input.error)
			});
		const { email, password, redirectTo = '/' } = input.data;

		// Count the attempt before checking the password: checking first and counting after let
		// 30 parallel guesses through a limit of 10 (issue 12, item 7). The upsert behind
		// consume is atomic, so of parallel attempts only the allowed number get a check.
		const checks = signInChecks(event.getClientAddress(), email);
		const allowed = await limits.consumeAll(checks);
		if (!allowed.ok)
			return tooManyRequests(allowed, lockoutMessage(allowed.retryAfterSeconds), {
				form: 'password',
				email
			});
		if (!(await signInWithPassword(event, email, password))) {
			return fail(400, { form: 'password', email, message: REFUSED });
		}
		// The limits count failures: a right password clears the account's count and gives the
		// address its point back.
		for (const [limiter, key] of checks) {
			if (limiter === 'signInByAccountAndAddress') await limits.reset(limiter, key);
			else await limits.refund(limiter, key);
		}
		redirect(303, redirectTo);
	},

	link: async (event) => {
		const fields = formFields(await event.request.formData());
		const input = linkSignInInput.safeParse(fields);
		if (!input.success)
			return fail(400, {
				form: 'link',
				email: fields.email ?? '',
				issues: fieldIssues(input.error)
			});
		const { email, redirectTo = '/' } = input.data;

		const allowed = await limits.consumeAll(emailLinkChecks(event.getClientAddress(), email));
		if (!allowed.ok) return tooManyRequests(allowed, undefined, { form: 'link', email });
		// The same answer, at once, for every address: the link goes out afterwards, and only
		// to an existing account.
		sendSignInLinkLater(event.url.origin, email, redirectTo);
		redirect(303, '/signin/check-email');
	}
};

/** Says when password sign-in opens again, and that the e-mail link is another way in now. */
function lockoutMessage(retryAfterSeconds: number): string {
	const minutes = Number.isFinite(retryAfterSeconds)
		? Math.max(1, Math.ceil(retryAfterSeconds / 60))
		: 1;
	const wait = minutes === 1 ? 'a minute' : `${minutes} minutes`;
	return `Too many password attempts. Try your password again in ${wait}; meanwhile a sign-in link by e-mail (below) still works.`;
}
