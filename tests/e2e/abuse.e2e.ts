import { expect, test } from '@playwright/test';
import type { APIRequestContext, Page } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { firstLink, listMessages, waitForMessage } from '../support/mailbox';
import {
	DEMO_PASSWORD,
	sessionOf,
	signInWithPassword,
	signUpConfirmed,
	uniqueEmail
} from './support';

/*
 * What an attacker or a careless user tried (issue 12, items 5, 7, 8 and 12), against the
 * production build. Limits are "common practice, no published source" (docs/security.md §4).
 */
test.describe.configure({ mode: 'serial' });

const form = (fields: Record<string, string>) => ({
	form: fields,
	headers: { origin: BASE_URL, accept: 'text/html' },
	maxRedirects: 0
});

test('signing out ends the session on the server: a copied session cookie stops working (item 5)', async () => {
	const signIn = await fetch(`${BASE_URL}/signin?/password`, {
		method: 'POST',
		body: new URLSearchParams({ email: 'reader@slotwise.test', password: DEMO_PASSWORD }),
		headers: { origin: BASE_URL, accept: 'text/html' },
		redirect: 'manual'
	});
	expect(signIn.status).toBe(303);
	const cookie = signIn.headers
		.getSetCookie()
		.map((c) => c.split(';')[0] ?? '')
		.filter((c) => c.includes('session-token'))
		.join('; ');
	expect(cookie).not.toBe('');
	const sessionWith = async (c: string) =>
		(await (await fetch(`${BASE_URL}/auth/session`, { headers: { cookie: c } })).json()) as {
			user?: { email: string };
		} | null;
	expect((await sessionWith(cookie))?.user?.email).toBe('reader@slotwise.test');

	// Someone copied the cookie before the owner signed out.
	const copied = cookie;
	const signOut = await fetch(`${BASE_URL}/signout`, {
		method: 'POST',
		body: new URLSearchParams({}),
		headers: { origin: BASE_URL, accept: 'text/html', cookie },
		redirect: 'manual'
	});
	expect(signOut.status).toBe(303);

	expect((await sessionWith(copied))?.user).toBeUndefined();
	const account = await fetch(`${BASE_URL}/account`, {
		headers: { cookie: copied },
		redirect: 'manual'
	});
	expect(account.status).toBe(303);
	expect(account.headers.get('location')).toMatch(/^\/signin\?/);
});

test('30 wrong passwords sent at once get at most 10 checks; the rest are refused (item 7)', async () => {
	const email = uniqueEmail('race');
	const answers = await Promise.all(
		Array.from({ length: 30 }, (_, i) =>
			fetch(`${BASE_URL}/signin?/password`, {
				method: 'POST',
				body: new URLSearchParams({ email, password: `wrong guess in parallel ${i}` }),
				headers: { origin: BASE_URL, accept: 'text/html' },
				redirect: 'manual'
			}).then((r) => ({ status: r.status, retryAfter: r.headers.get('retry-after') }))
		)
	);
	// 400 means the password was checked (and was wrong).
	const checked = answers.filter((a) => a.status === 400).length;
	// docs/security.md §4: 10 failed sign-ins per account and address per 15 minutes.
	expect(checked).toBeLessThanOrEqual(10);
	// Everyone else is refused with Retry-After: 429 over the limit, or 503 when the limit's
	// store could not answer in time under the burst (it fails closed, §4).
	const refused = answers.filter((a) => a.status !== 400);
	expect(refused.filter((a) => a.status !== 429 && a.status !== 503)).toEqual([]);
	expect(refused.filter((a) => a.status === 429).length).toBeGreaterThan(0);
	expect(refused.every((a) => Number(a.retryAfter) > 0)).toBe(true);
});

test('password reset and sign-up answer known and unknown addresses the same way (item 8)', async ({
	request
}) => {
	const answer = async (path: string, fields: Record<string, string>) => {
		const response = await request.post(path, form(fields));
		return {
			status: response.status(),
			location: response.headers()['location'],
			body: await response.text()
		};
	};
	const known = await answer('/reset', { email: 'editor@slotwise.test' });
	const unknown = await answer('/reset', { email: uniqueEmail('nobody') });
	expect(known).toEqual(unknown);
	expect(known).toMatchObject({ status: 303, location: '/reset?sent' });

	const password = 'willow gravel thunder pocket';
	const existing = await answer('/signup', {
		name: 'Someone',
		email: 'author@slotwise.test',
		password
	});
	const fresh = await answer('/signup', { name: 'Someone', email: uniqueEmail('new'), password });
	expect(existing).toEqual(fresh);
	expect(existing).toMatchObject({ status: 303, location: '/signup?sent' });
});

