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

async function signedInContext(page: Page, label: string): Promise<APIRequestContext> {
	await signUpConfirmed(page, `Flood ${label}`, uniqueEmail(label), 'copper meadow lantern swift');
	return page.request;
}

test('e-mail change requests are limited per account, with Retry-After (item 12)', async ({
	page
}) => {
	const request = await signedInContext(page, 'mover');
	const statuses: number[] = [];
	let retryAfter = '';
	const targets: string[] = [];
	for (let i = 0; i < 7; i++) {
		const newEmail = uniqueEmail(`target${i}`);
		targets.push(newEmail);
		const response = await request.post('/account?/email', {
			...form({ newEmail, password: 'copper meadow lantern swift' })
		});
		statuses.push(response.status());
		if (response.status() === 429) retryAfter = response.headers()['retry-after'] ?? '';
	}
	// docs/security.md §4: 5 e-mail change requests per account per hour.
	expect(statuses.slice(0, 5)).toEqual([200, 200, 200, 200, 200]);
	expect(statuses.slice(5)).toEqual([429, 429]);
	expect(Number(retryAfter)).toBeGreaterThan(0);
	await waitForMessage({ to: targets[4] ?? '', subject: /confirm/i });
	const sentTo = new Set((await listMessages()).flatMap((m) => m.to.map((t) => t.toLowerCase())));
	expect(sentTo.has(targets[5] ?? '')).toBe(false);
	expect(sentTo.has(targets[6] ?? '')).toBe(false);
});

test('forks are limited per account, with Retry-After (item 12)', async ({ page }) => {
	const request = await signedInContext(page, 'forker');
	const statuses: number[] = [];
	let retryAfter = '';
	for (let i = 0; i < 21; i++) {
		const response = await request.post('/api/v1/guides/pocket-itx-1440p/fork', {
			data: {},
			headers: { origin: BASE_URL }
		});
		statuses.push(response.status());
		if (response.status() === 429) {
			retryAfter = response.headers()['retry-after'] ?? '';
			expect(await response.json()).toMatchObject({ message: expect.any(String) });
		}
	}
	// docs/security.md §4: 20 forks per account per hour.
	expect(statuses.slice(0, 20).every((s) => s === 201)).toBe(true);
	expect(statuses[20]).toBe(429);
	expect(Number(retryAfter)).toBeGreaterThan(0);
});

test('guide creation is limited per account, with Retry-After (item 12)', async ({
	page,
	browser
}) => {
	const request = await signedInContext(page, 'writer');
	const me = (await sessionOf(page)) as { user?: { id?: string } } | null;
	const userId = me?.user?.id ?? '';
	expect(userId).not.toBe('');

	// An admin makes the new account an author (the admin page's own action).
	const adminContext = await browser.newContext();
	const admin = await adminContext.newPage();
	await signInWithPassword(admin, 'admin@slotwise.test');
	const promoted = await admin.request.post('/admin/users?/changeRole', {
		...form({ userId, role: 'author' })
	});
	expect(promoted.status()).toBe(200);
	await adminContext.close();

	const statuses: number[] = [];
	let retryAfter = '';
	for (let i = 0; i < 11; i++) {
		const response = await request.post('/api/v1/guides', {
			data: {
				title: `Flood guide number ${i}`,
				summary: 'A draft made to test the limit.',
				targetBudget: '900.00',
				baseRegion: 'us',
				tags: [],
				disclosure: 'none',
				disclosureNote: '',
				walkthroughUrl: ''
			},
			headers: { origin: BASE_URL }
		});
		statuses.push(response.status());
		if (response.status() === 429) retryAfter = response.headers()['retry-after'] ?? '';
	}
	// docs/security.md §4: 10 new guides per account per hour.
	expect(statuses.slice(0, 10).every((s) => s === 201)).toBe(true);
	expect(statuses[10]).toBe(429);
	expect(Number(retryAfter)).toBeGreaterThan(0);
});

test('a sign-in link is sent only for an existing account: an unknown address gets the same answer and no link (item 12)', async ({
	request
}) => {
	const unknown = uniqueEmail('stranger');
	const asked = new Date();
	const first = await request.post('/signin?/link', form({ email: unknown }));
	const second = await request.post('/signin?/link', form({ email: 'author@slotwise.test' }));
	expect(first.status()).toBe(303);
	expect(second.status()).toBe(first.status());
	expect(first.headers()['location']).toBe(second.headers()['location']);

	// The link for the existing account arrives; the stranger's never does.
	const link = firstLink(
		await waitForMessage({ to: 'author@slotwise.test', subject: /sign-in link/i, after: asked }),
		'/auth/callback/nodemailer'
	);
	expect(link).toContain('/auth/callback/nodemailer');
	await new Promise((r) => setTimeout(r, 3_000));
	const strangerMail = (await listMessages()).filter((m) =>
		m.to.some((t) => t.toLowerCase() === unknown)
	);
	expect(strangerMail).toEqual([]);
});
