import { expect, test } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { firstLink, waitForMessage } from '../support/mailbox';
import { DEMO_PASSWORD, sessionOf, signInWithPassword, uniqueEmail } from './support';

test.describe.configure({ mode: 'serial' });

for (const [email, role] of [
	['admin@slotwise.test', 'admin'],
	['editor@slotwise.test', 'editor'],
	['author@slotwise.test', 'author'],
	['reader@slotwise.test', 'reader']
] as const) {
	test(`the demo ${role} signs in through the form and the session shows the role`, async ({
		page
	}) => {
		await signInWithPassword(page, email);
		await expect(page).toHaveURL(/\/$/);
		await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
		const session = await sessionOf(page);
		expect(session?.user).toMatchObject({ email, role });
	});
}

test('sign up → verification e-mail → confirm → sign in', async ({ page }) => {
	const email = uniqueEmail('newcomer');
	const password = 'marble heron quietly sings';
	await page.goto('/signup');
	await page.getByLabel('Name').fill('Nell Newcomer');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();

	// Before confirming, the password does not open the account.
	await signInWithPassword(page, email, password, false);
	await expect(page.getByRole('alert')).toContainText('do not match an account');

	const message = await waitForMessage({ to: email, subject: /confirm/i });
	await page.goto(firstLink(message, '/verify'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await expect(page.getByText('Your address is confirmed')).toBeVisible();

	await signInWithPassword(page, email, password);
	await expect(page).toHaveURL(/\/$/);
	expect((await sessionOf(page))?.user).toMatchObject({ email, role: 'reader' });
});

test('sign-up with an address that has an account reveals nothing and mails the owner', async ({
	page
}) => {
	await page.goto('/signup');
	await page.getByLabel('Name').fill('Someone Else');
	await page.getByLabel('E-mail').fill('reader@slotwise.test');
	await page.getByLabel('Password').fill('another long pass phrase');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	const note = await waitForMessage({ to: 'reader@slotwise.test', subject: /already|account/i });
	expect(note.text).toMatch(/sign in|reset/i);
});

test('a sign-in link signs in once and cannot be used again', async ({ page, browser }) => {
	await page.goto('/signin');
	const panel = page.locator('section', {
		has: page.getByRole('heading', { name: 'With a link by e-mail' })
	});
	await panel.getByLabel('E-mail').fill('editor@slotwise.test');
	const asked = new Date();
	await panel.getByRole('button', { name: 'Send me a link' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();

	const message = await waitForMessage({
		to: 'editor@slotwise.test',
		subject: /sign-in link/i,
		after: asked
	});
	const link = firstLink(message, '/auth/callback/nodemailer');
	await page.goto(link);
	expect((await sessionOf(page))?.user).toMatchObject({
		email: 'editor@slotwise.test',
		role: 'editor'
	});

	const other = await browser.newContext();
	const second = await other.newPage();
	await second.goto(link);
	await expect(second).toHaveURL(/\/signin\?error=Verification/);
	expect(await sessionOf(second)).toBeNull();
	await other.close();
});

test('password reset by e-mail: the new password works, the old one and the link do not', async ({
	page
}) => {
	const email = uniqueEmail('forgetful');
	const oldPassword = 'amber kettle drifting north';
	const newPassword = 'seven lanterns over copper hills';
	await page.goto('/signup');
	await page.getByLabel('Name').fill('Fern Forgetful');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(oldPassword);
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.goto(firstLink(await waitForMessage({ to: email, subject: /confirm/i }), '/verify'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();

	await page.goto('/reset');
	await page.getByLabel('E-mail').fill(email);
	await page.getByRole('button', { name: 'Send reset link' }).click();
	await expect(page.getByText('a reset link is on its way')).toBeVisible();
	const link = firstLink(await waitForMessage({ to: email, subject: /reset/i }), '/reset/');

	await page.goto(link);
	await page.getByLabel('New password').fill('short');
	await page.getByRole('button', { name: 'Set new password' }).click();
	await expect(page.getByText(/at least 15 characters/i).first()).toBeVisible();
	await page.getByLabel('New password').fill(newPassword);
	await page.getByRole('button', { name: 'Set new password' }).click();
	await expect(page).toHaveURL(/\/signin\?changed/);

	await signInWithPassword(page, email, oldPassword, false);
	await expect(page.getByRole('alert')).toContainText('do not match');
	await signInWithPassword(page, email, newPassword);
	await expect(page).toHaveURL(/\/$/);

	await page.goto(link);
	await expect(page.getByText('expired or was already used')).toBeVisible();
});

test('20 bad passwords from one address get 429, and the owner can still sign in by link', async ({
	page
}) => {
	// A seeded community author nobody else signs in as in these tests.
	const email = 'tobias.wren@slotwise.test';
	const statuses: number[] = [];
	let retryAfter: string | null = null;
	for (let i = 0; i < 20; i++) {
		const response = await page.request.post('/signin?/password', {
			form: { email, password: `wrong guess number ${i}` },
			headers: { origin: BASE_URL, accept: 'text/html' }
		});
		statuses.push(response.status());
		if (response.status() === 429) retryAfter = response.headers()['retry-after'] ?? null;
	}
	expect(statuses.slice(0, 10).every((s) => s !== 429)).toBe(true);
	expect(statuses.slice(-5).every((s) => s === 429)).toBe(true);
	expect(Number(retryAfter)).toBeGreaterThan(0);

	// Even the right password is refused while the block lasts…
	const blocked = await page.request.post('/signin?/password', {
		form: { email, password: DEMO_PASSWORD },
		headers: { origin: BASE_URL, accept: 'text/html' }
	});
	expect(blocked.status()).toBe(429);
	// The page says when to try again and that the e-mail link still works (issue 15).
	const said = await blocked.text();
	expect(said).toMatch(/Try your password again in (a minute|\d+ minutes)/);
	expect(said).toContain('a sign-in link by e-mail (below) still works');

	// …but a sign-in link still gets the owner in.
	await page.goto('/signin');
	const panel = page.locator('section', {
		has: page.getByRole('heading', { name: 'With a link by e-mail' })
	});
	await panel.getByLabel('E-mail').fill(email);
	const asked = new Date();
	await panel.getByRole('button', { name: 'Send me a link' }).click();
	const message = await waitForMessage({ to: email, subject: /sign-in link/i, after: asked });
	await page.goto(firstLink(message, '/auth/callback/nodemailer'));
	expect((await sessionOf(page))?.user?.email).toBe(email);
});
