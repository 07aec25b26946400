import { expect, test } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { type AppProcess, cleanUp, postForm, signIn, startApp } from './processes';
import { signInWithPassword, uniqueEmail } from './support';

/*
 * Two app processes on one database, as behind a load balancer: the app under test (A, the
 * one npm test starts) and a second one started with `npm run serve`'s script (B, on a free
 * port, no migration, seed or build of its own). Nothing a request needs may live in one
 * process's memory: a session made by one is honoured by the other, and a rate limit counts
 * attempts made on both.
 */
test.describe.configure({ mode: 'serial', timeout: 90_000 });

let second: AppProcess;

test.beforeAll(async () => {
	// Set-up starts real processes: minutes on a loaded machine, not the 30 s default.
	test.setTimeout(90_000);
	second = await startApp({ DB_NAME: process.env.DB_NAME ?? 'slotwise_e2e' }, [
		'bash',
		'scripts/serve.sh'
	]);
});

test.afterAll(async () => {
	const exit = await second?.stop();
	// npm run serve hands over to node build, which ends cleanly on SIGTERM.
	await cleanUp();
	expect(exit?.code, second?.output()).toBe(0);
});

test('a session made by one process is honoured by the other, both ways', async ({ page }) => {
	// In the browser: sign in through A's form, then open B's account page. Cookies belong to
	// the host, not the port, as they would to one domain behind a load balancer.
	await signInWithPassword(page, 'reader@slotwise.test');
	await page.goto(`${second.origin}/account`);
	await expect(page).toHaveURL(`${second.origin}/account`);
	await expect(page.getByText('reader@slotwise.test').first()).toBeVisible();

	// Without a browser, the other way round: signed in on B, read on A.
	const cookie = await signIn(second.origin, 'author@slotwise.test');
	const onA = await fetch(`${BASE_URL}/auth/session`, { headers: { cookie } });
	expect(await onA.json()).toMatchObject({
		user: { email: 'author@slotwise.test', role: 'author' }
	});
	const myGuides = await fetch(`${BASE_URL}/my/guides`, { headers: { cookie } });
	expect(myGuides.status).toBe(200);
	// And a visitor without the cookie is sent to sign in on either.
	for (const origin of [BASE_URL, second.origin]) {
		const visitor = await fetch(`${origin}/my/guides`, { redirect: 'manual' });
		expect(visitor.status).toBe(303);
		expect(visitor.headers.get('location')).toContain('/signin');
	}
});

test('the sign-in limit counts failures on both processes as one', async () => {
	// docs/security.md §4: 10 failed sign-ins per account and address per 15 min, then blocked.
	// Five failures on each process: neither alone has seen 10, so only a shared count refuses
	// the 11th.
	const email = uniqueEmail('two-processes');
	const statuses: number[] = [];
	for (let i = 0; i < 10; i++) {
		const origin = i % 2 === 0 ? BASE_URL : second.origin;
		const response = await postForm(origin, '/signin?/password', {
			email,
			password: `wrong password ${i}`
		});
		statuses.push(response.status);
	}
	expect(statuses).toEqual(Array(10).fill(400));
	for (const origin of [BASE_URL, second.origin]) {
		const refused = await postForm(origin, '/signin?/password', {
			email,
			password: 'yet another guess'
		});
		expect(refused.status, origin).toBe(429);
		expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
	}
});
