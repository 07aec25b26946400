import AxeBuilder from '@axe-core/playwright';
import { expect } from '@playwright/test';
import type { Locator, Page } from '@playwright/test';
import { request as httpRequest } from 'node:http';
import { createServer } from 'node:net';
import mysql from 'mysql2/promise';
import { BASE_URL } from '../playwright.config';

export const DEMO_PASSWORD = 'slotwise-demo-password';

/**
 * Signs in through the real form (password panel). By default waits until the app has
 * left the sign-in page, so the session cookie is set before the next navigation.
 */
export async function signInWithPassword(
	page: Page,
	email: string,
	password = DEMO_PASSWORD,
	expectSuccess = true
) {
	if (expectSuccess) await forgetAddressCounts();
	await page.goto('/signin');
	const panel = page.locator('section', {
		has: page.getByRole('heading', { name: 'With your password' })
	});
	await panel.getByLabel('E-mail').fill(email);
	await panel.getByLabel('Password').fill(password);
	await panel.getByRole('button', { name: 'Sign in' }).click();
	if (expectSuccess) await expect(page).not.toHaveURL(/\/signin/);
	else await expect(page.getByRole('alert')).toBeVisible();
}

/** The session as Auth.js reports it at /auth/session. */
export async function sessionOf(
	page: Page
): Promise<{ user?: { email: string; role: string } } | null> {
	const response = await page.request.get('/auth/session');
	expect(response.status()).toBe(200);
	return (await response.json()) as { user?: { email: string; role: string } } | null;
}

/** A fresh address per run, so tests never collide in the shared fake mailbox. */
export function uniqueEmail(label: string): string {
	return `${label}-${Date.now()}-${Math.floor(Math.random() * 1e6)}@example.test`;
}

/** Signs up through the form, confirms the address from the e-mail, and signs in. */
/*
 * Every browser in this suite comes from 127.0.0.1, and the app counts per address: 10
 * sign-ups an hour and 100 refused sign-ins an hour (src/lib/server/rate-limit.ts, signUp and
 * signInByAddress). The limits are right for the site and have their own tests (abuse.e2e.ts);
 * the fuzz and abuse suites alone spend the address's sign-in allowance, and an accounts test
 * blocks one seeded author for 15 minutes (10 refused sign-ins per account and address). A
 * helper that expects to get in starts from fresh counts instead of the limits being loosened.
 */
export async function forgetAddressCounts(): Promise<void> {
	await forgetCounts('signup_addr', 'signin_addr', 'signin_acct_addr');
}

/** A connection to the database the app under test uses (scripts/test.sh sets DB_*). */
export function connectToE2eDb(): Promise<mysql.Connection> {
	return mysql.createConnection({
		host: process.env.DB_HOST ?? '127.0.0.1',
		port: Number(process.env.DB_PORT ?? 3307),
		user: process.env.DB_USER ?? 'slotwise',
		password: process.env.DB_PASSWORD ?? 'slotwise-dev',
		database: process.env.DB_NAME ?? 'slotwise_e2e'
	});
}

/**
 * Forgets the counts of the named limiters (rate_limits key prefixes, e.g. 'photo_user'), for
 * a test that is about something else than the limit: the fuzz suite spends whole allowances.
 */
export async function forgetCounts(...prefixes: string[]): Promise<void> {
	const connection = await connectToE2eDb();
	try {
		const escaped = prefixes.map((p) => `${p.replace(/[\\%_]/g, (c) => `\\${c}`)}:%`);
		await connection.query(
			`DELETE FROM rate_limits WHERE ${escaped.map(() => '`key` LIKE ?').join(' OR ')}`,
			escaped
		);
	} finally {
		await connection.end();
	}
}

export async function signUpConfirmed(page: Page, name: string, email: string, password: string) {
	await forgetAddressCounts();
	const { firstLink, waitForMessage } = await import('../support/mailbox');
	await page.goto('/signup');
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	await page.goto(firstLink(await waitForMessage({ to: email, subject: /confirm/i }), '/verify'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await expect(page.getByText('Your address is confirmed')).toBeVisible();
	await signInWithPassword(page, email, password);
	await expect(page).toHaveURL(/\/$/);
}

/** axe-core's serious and critical WCAG 2.0–2.2 A/AA violations on the page, one line each with the selectors flagged. */
export async function severeViolations(page: Page): Promise<string[]> {
	const results = await new AxeBuilder({ page })
		.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
		.analyze();
	return results.violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map(
			(v) => `${v.impact} ${v.id}: ${v.help} → ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`
		);
}

/** A TCP port free on 127.0.0.1 right now: tests never assume one another checkout may hold. */
export function freePort(attempts = 50): Promise<number> {
	// Drawn below Linux's ephemeral range (32768-60999), like scripts/lib.sh free_port: a port
	// the kernel hands out for listen(0) may be taken by an outgoing connection before use.
	const port = 20000 + Math.floor(Math.random() * 12768);
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', (error) => {
			if (attempts > 0) resolve(freePort(attempts - 1));
			else reject(error);
		});
		server.listen(port, '127.0.0.1', () => server.close(() => resolve(port)));
	});
}

/**
 * Posts `body` to `path` in chunks, with no Content-Length, as a streaming client would: a
 * body the app can only measure while it reads it. Sent with our Origin, asking for HTML.
 */
export function postChunked(
	path: string,
	body: string | Buffer,
	contentType = 'application/x-www-form-urlencoded'
): Promise<{ status: number; text: string }> {
	const url = new URL(path, BASE_URL);
	return new Promise((resolve, reject) => {
		const sent = httpRequest(
			url,
			{
				method: 'POST',
				headers: {
					origin: BASE_URL,
					accept: 'text/html',
					'content-type': contentType,
					'transfer-encoding': 'chunked'
				}
			},
			(answer) => {
				let text = '';
				answer.setEncoding('utf8');
				answer.on('data', (chunk) => (text += chunk));
				answer.on('end', () => resolve({ status: answer.statusCode ?? 0, text }));
			}
		);
		// A closed socket after the answer is fine: the server need not read the rest.
		sent.on('error', (problem) => reject(problem));
		for (let at = 0; at < body.length; at += 64 * 1024) sent.write(body.slice(at, at + 64 * 1024));
		sent.end();
	});
}

/**
 * Starts keeping every text a polite live region holds, as a screen reader would hear it
 * change; `announcements` reads them back. The region must be on the page before the change.
 */
export async function recordAnnouncements(region: Locator): Promise<void> {
	await expect(region).toHaveAttribute('aria-live', 'polite');
	await region.evaluate((el) => {
		const said: string[] = [];
		(window as unknown as { said: string[] }).said = said;
		new MutationObserver(() =>
			said.push(el.textContent?.replace(/\s+/g, ' ').trim() ?? '')
		).observe(el, { subtree: true, childList: true, characterData: true });
	});
}

export function announcements(page: Page): Promise<string[]> {
	return page.evaluate(() => (window as unknown as { said?: string[] }).said ?? []);
}

/** The computed colour of an element's ::backdrop, drawn on a canvas: its sRGB luminance and alpha (0–1). */
export function backdropOf(
	dialog: Locator
): Promise<{ colour: string; luminance: number; alpha: number }> {
	return dialog.evaluate((el) => {
		const colour = getComputedStyle(el, '::backdrop').backgroundColor;
		const context = document.createElement('canvas').getContext('2d');
		if (!context) throw new Error('no 2d canvas');
		context.fillStyle = colour;
		context.fillRect(0, 0, 1, 1);
		const [r = 0, g = 0, b = 0, a = 0] = context.getImageData(0, 0, 1, 1).data;
		return { colour, luminance: (0.2126 * r + 0.7152 * g + 0.0722 * b) / 255, alpha: a / 255 };
	});
}
