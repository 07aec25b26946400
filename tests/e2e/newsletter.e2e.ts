import { expect, request as playwrightRequest, test } from '@playwright/test';
import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { firstLink, waitForMessage } from '../support/mailbox';
import { forgetCounts, signInWithPassword, uniqueEmail } from './support';

/*
 * Issue 17, "Done when": subscribe → confirm from the SMTP fake's mailbox → an editor approves
 * a guide and sends a mailing → each message arrives with both unsubscribe headers and the
 * guide's total in the recipient's own region and currency → a one-click POST with no Origin
 * header unsubscribes. Production build, Chromium, the real SMTP protocol to the local fake,
 * and the app's own mail worker.
 *
 * The guide has two picks with exactly one quote per region in the demo data
 * (src/lib/server/db/seeders/demo-data/quotes.ts, invented prices):
 *   halvard-strata-408: US $139.99 (pre-tax), Germany €149.90 (VAT included)
 *   brisk-ddr4-3200-32gb: US $54.99, Germany €64.90
 * so both regions are "quoted", and the totals are plain sums worked by hand:
 *   United States: $139.99 + $54.99 = $194.98; Germany: €149.90 + €64.90 = €214.80.
 */

const AUTHOR = 'author@slotwise.test';
const EDITOR = 'editor@slotwise.test';

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

/**
 * Part ids by slug. The public part API names parts by slug only, so they are read from the
 * demo author's own starter guide draft, where both parts are picks or alternates.
 */
async function partIds(
	request: APIRequestContext,
	slugs: [string, string]
): Promise<[number, number]> {
	const response = await request.get('/api/v1/guides/steady-1080p-starter/draft');
	expect(response.status()).toBe(200);
	const draft = (await response.json()) as {
		slots: {
			pickPartId: number;
			pick: { slug: string };
			alternates: { partId: number; part?: { slug: string } }[];
		}[];
	};
	const ids = new Map<string, number>();
	for (const slot of draft.slots) {
		ids.set(slot.pick.slug, slot.pickPartId);
		for (const a of slot.alternates) if (a.part) ids.set(a.part.slug, a.partId);
	}
	const idOf = (slug: string) => {
		const id = ids.get(slug);
		expect(id, slug).toBeDefined();
		return id as number;
	};
	return [idOf(slugs[0]), idOf(slugs[1])];
}

/** A two-pick guide by the demo author, submitted through the author JSON API. */
async function submitGuide(request: APIRequestContext, title: string): Promise<string> {
	const meta = {
		title,
		summary: 'Two picks, priced by hand for the newsletter test.',
		targetBudget: '250',
		baseRegion: 'us',
		tags: ['1080p'],
		disclosure: 'none'
	};
	// The author's guide-creation allowance (10 an hour) is spent by earlier suites.
	await forgetCounts('guide_create_user');
	const created = await request.post('/api/v1/guides', { data: meta });
	expect(created.status()).toBe(201);
	const { slug, version } = (await created.json()) as { slug: string; version: number };
	const [cpuId, memoryId] = await partIds(request, ['halvard-strata-408', 'brisk-ddr4-3200-32gb']);
	const slot = (category: string, label: string, pickPartId: number) => ({
		category,
		label,
		quantity: 1,
		pickPartId,
		reason: 'Chosen for the newsletter test.',
		alternates: []
	});
	const saved = await request.put(`/api/v1/guides/${slug}/draft`, {
		data: {
			version,
			...meta,
			buildNotes: { firmware: '', assembly: '', cabling: '', display: '' },
			slots: [slot('cpu', 'CPU', cpuId), slot('memory', 'Memory', memoryId)]
		}
	});
	expect(saved.status(), await saved.text()).toBe(200);
	const submitted = await request.post(`/api/v1/guides/${slug}/submit`, {
		data: { version: (await saved.json()).version }
	});
	expect(submitted.status(), await submitted.text()).toBe(200);
	return slug;
}

/** Subscribes through the page, then follows the confirmation link from the mailbox. */
async function subscribeAndConfirm(page: Page, email: string, regionLabel: string) {
	await page.goto('/newsletter');
	await page.getByLabel('E-mail', { exact: true }).first().fill(email);
	await page.getByLabel('Your region').selectOption({ label: regionLabel });
	await page.getByRole('button', { name: 'Subscribe', exact: true }).click();
	await expect(page.getByText('Check your inbox')).toBeVisible();
	const mail = await waitForMessage({ to: email, subject: /^Confirm your Slotwise newsletter/ });
	await page.goto(firstLink(mail, '/newsletter/confirm'));
	await page.getByRole('button', { name: 'Confirm subscription' }).click();
	await expect(page.getByText('You are subscribed.')).toBeVisible();
}

test('subscribe, confirm, approve and mail a guide, then one-click unsubscribe without an Origin', async ({
	browser
}) => {
	test.setTimeout(180_000); // sign-ins, a review and a mailing through the queue on a shared machine
	const visitor = await (await browser.newContext()).newPage();
	const inUs = uniqueEmail('news-us');
	const inDe = uniqueEmail('news-de');
	await subscribeAndConfirm(visitor, inUs, 'United States (USD)');
	await subscribeAndConfirm(visitor, inDe, 'Germany (EUR)');

	// Nothing can be mailed before moderation: the submitted guide is not offered yet.
	const title = `Mailed guide ${Date.now()}`;
	const author = await signedIn(browser, AUTHOR);
	const slug = await submitGuide(author.request, title);
	const editor = await signedIn(browser, EDITOR);
	await editor.goto('/editor/mailings');
	await expect(editor.getByRole('heading', { name: 'Mailings', level: 1 })).toBeVisible();
	await expect(editor.getByText(title)).toHaveCount(0);

	await editor.goto('/review');
	await editor.getByTestId('review-queue').getByRole('link', { name: title }).click();
	await editor.getByRole('button', { name: 'Publish', exact: true }).click();
	await editor.getByRole('button', { name: 'Yes, publish now' }).click();
	await expect(editor.getByText('Published: this revision is now live.')).toBeVisible();

	// Readers reach the author's page from the guide: it lists the new guide.
	await visitor.goto(`/guides/${slug}`);
	await visitor.getByRole('link', { name: 'Priya Lindqvist', exact: true }).first().click();
	await expect(visitor).toHaveURL(/\/authors\/priya-lindqvist$/);
	await expect(visitor.getByRole('link', { name: title })).toBeVisible();

	await editor.goto('/editor/mailings');
	const row = editor.getByRole('listitem').filter({ hasText: title });
	await row.getByRole('button', { name: 'Draft a mailing' }).click();
	await expect(editor).toHaveURL(/\/editor\/mailings\/\d+$/);
	await expect(editor.getByRole('button', { name: 'Start sending' })).toBeDisabled();
	await editor.getByRole('button', { name: 'Send a test copy to me' }).click();
	await expect(editor.getByText(`A test copy is on its way to ${EDITOR}.`)).toBeVisible();
	await editor.getByRole('button', { name: 'Start sending' }).click();
	await expect(editor.getByText(/^Started: \d+ recipients queued\.$/)).toBeVisible();

	// The mailing's default subject; each address also holds its confirmation mail.
	const mailed = new RegExp(`^New guide: ${title}$`);
	const us = await waitForMessage({ to: inUs, subject: mailed, timeoutMs: 30_000 });
	const de = await waitForMessage({ to: inDe, subject: mailed, timeoutMs: 30_000 });
	// Hand sums of the demo quotes (header comment).
	expect(us.text).toContain(
		'In United States the picks come to US$194.98 (every pick quoted by a store there).'
	);
	expect(de.text).toContain(
		'In Germany the picks come to €214.80 (every pick quoted by a store there).'
	);
	for (const message of [us, de]) {
		// RFC 2369 and RFC 8058 (docs/sources.md 12).
		expect(message.headers['list-unsubscribe']).toMatch(
			/^<http:\/\/127\.0\.0\.1:\d+\/newsletter\/unsubscribe\?token=u\.[^>]+>$/
		);
		expect(message.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
	}
	// The progress bar updates live to two or more sent (other confirmed subscribers may exist).
	await expect(editor.getByTestId('progress-remaining')).toHaveText('0', { timeout: 30_000 });

	// One-click as a mail provider sends it: no session, no Origin header (RFC 8058 §3.1).
	const target = /^<([^>]+)>$/.exec(us.headers['list-unsubscribe'] ?? '')?.[1] ?? '';
	const provider = await playwrightRequest.newContext();
	const forged = await provider.post(target.replace(/token=u\.[^.&]+/, 'token=u.zz'), {
		form: { 'List-Unsubscribe': 'One-Click' },
		maxRedirects: 0
	});
	expect([400, 404]).toContain(forged.status());
	const oneClick = await provider.post(target, {
		form: { 'List-Unsubscribe': 'One-Click' },
		maxRedirects: 0
	});
	expect(oneClick.status()).toBe(200);
	await visitor.goto(target);
	await expect(visitor.getByText('You are unsubscribed')).toBeVisible();
	// Every other form POST keeps the origin check: the same body elsewhere, without an Origin, is 403.
	const elsewhere = await provider.post(`${BASE_URL}/newsletter?/subscribe`, {
		form: { email: uniqueEmail('cross-site'), homeRegion: 'us' },
		maxRedirects: 0
	});
	expect(elsewhere.status()).toBe(403);
	await provider.dispose();
	for (const page of [visitor, author, editor]) await page.context().close();
});

test('a forged or expired newsletter link gets a clear page and a 4xx, never a 500', async ({
	page
}) => {
	for (const path of ['/newsletter/confirm', '/newsletter/manage', '/newsletter/unsubscribe']) {
		const response = await page.goto(`${path}?token=x.forged`);
		expect([400, 404], path).toContain(response?.status());
		await expect(page.getByText(/Nothing was changed|Copy the whole link/)).toBeVisible();
	}
});

test('notice settings saved from the account page keep an unticked box unticked, at 390 px', async ({
	browser
}) => {
	const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const page = await context.newPage();
	await signInWithPassword(page, 'reader@slotwise.test');
	await page.goto('/account#notices');
	const panel = page.locator('section#notices');
	const box = panel.getByRole('checkbox').first();
	const label = await box.getAttribute('aria-label');
	const before = await box.isChecked();
	await box.setChecked(!before);
	await panel.getByRole('button', { name: 'Save notice settings' }).click();
	// The answer appears in the panel where the reader pressed the button.
	await expect(panel.getByText('Your notice settings are saved.')).toBeVisible();
	await page.reload();
	await expect(page.getByRole('checkbox', { name: label ?? '' })).toBeChecked({
		checked: !before
	});
	// Put it back for the tests that follow.
	await page.getByRole('checkbox', { name: label ?? '' }).setChecked(before);
	await page.getByRole('button', { name: 'Save notice settings' }).click();
	await expect(page.getByText('Your notice settings are saved.')).toBeVisible();
	await context.close();
});
