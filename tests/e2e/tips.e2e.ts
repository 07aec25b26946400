import { expect, test } from '@playwright/test';
import type { Browser, Page } from '@playwright/test';
import { listMessages, waitForMessage } from '../support/mailbox';
import { BASE_URL } from '../playwright.config';
import { severeViolations, signInWithPassword, signUpConfirmed, uniqueEmail } from './support';

/*
 * Tips in Chromium against the production build and the local payment provider fake
 * (scripts/stripe-fake.ts), which npm test starts and registers this app's webhook with. A
 * fresh reader tips the author of the demo's quiet 4K guide from the guide page, pays on the
 * fake's hosted page and comes back to the thank-you page. The fake delivers the webhook
 * events newest first and checkout.session.completed twice; the ledger (admin list), the
 * author's earnings, the receipt and the author's notice must each show the tip exactly once.
 */

const GUIDE = 'quiet-4k-play-and-work';
const AUTHOR = 'tobias.wren@slotwise.test';
const ADMIN = 'admin@slotwise.test';
const PASSWORD = 'a long and unusual passphrase 42';

async function newPage(browser: Browser, width: number): Promise<Page> {
	const context = await browser.newContext({ viewport: { width, height: 900 } });
	return context.newPage();
}

/** The author's total in one currency on the earnings page, and the tips counted in it. */
async function earningsIn(page: Page, currency: string) {
	await page.goto('/my/earnings');
	const total = page.getByRole('row', { name: new RegExp(`^Total in ${currency}`) });
	if ((await total.count()) === 0) return { count: 0, text: '' };
	const cells = total.getByRole('cell');
	return { count: Number(await cells.nth(0).innerText()), text: await cells.nth(1).innerText() };
}

async function noSidewaysScroll(page: Page) {
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth - document.documentElement.clientWidth
	);
	expect(overflow, 'no horizontal scrolling').toBeLessThanOrEqual(0);
}

test('a reader tips an author from a guide; every record shows it exactly once', async ({
	browser
}) => {
	test.setTimeout(120_000);
	const author = await newPage(browser, 1280);
	await signInWithPassword(author, AUTHOR);
	const before = await earningsIn(author, 'EUR');

	const reader = await newPage(browser, 1280);
	const email = uniqueEmail('tipper');
	await signUpConfirmed(reader, 'Noor Tipper', email, PASSWORD);
	const token = `note-${Date.now()}`;

	await reader.goto(`/guides/${GUIDE}?region=de`);
	await reader.getByRole('link', { name: /Support Tobias Wren with a tip/ }).click();
	await expect(
		reader.getByRole('heading', { level: 1, name: 'Support Tobias Wren' })
	).toBeVisible();
	await reader.goto(`/guides/${GUIDE}/tip?currency=EUR`);
	expect(await severeViolations(reader)).toEqual([]);
	// Out of limits first: refused with the limits named, nothing started.
	await reader.getByLabel('Another amount').check();
	await reader.getByLabel('Your amount, if another').fill('250');
	await reader.getByRole('button', { name: 'Continue to payment' }).click();
	await expect(reader.getByText('Tips are between €1.00 and €200.00.')).toBeVisible();

	await reader.getByLabel('Your amount, if another').fill('7.50');
	await reader.getByLabel('A public note (optional)').fill(`Thanks for the quiet build ${token}`);
	await reader.getByRole('button', { name: 'Continue to payment' }).click();

	// The provider fake's hosted page: no card field anywhere.
	await expect(reader.getByRole('heading', { name: 'Test payment page' })).toBeVisible();
	await expect(reader.getByText('7.50 EUR')).toBeVisible();
	await reader.getByRole('button', { name: 'Pay (test success)' }).click();

	await expect(reader).toHaveURL(/\/tips\/thanks\?session_id=cs_test_/);
	await expect(reader.getByRole('heading', { name: 'Thank you for your tip' })).toBeVisible({
		timeout: 20_000
	});
	await expect(reader.getByText('€7.50')).toBeVisible();

	// The fake sent three deliveries to us: payment_intent.succeeded, then the older
	// checkout.session.completed twice (same id). All answered 200.
	const stripeUrl = process.env.STRIPE_API_URL;
	expect(stripeUrl, 'npm test sets STRIPE_API_URL').toBeTruthy();
	await expect
		.poll(async () => {
			const { deliveries } = (await (await fetch(`${stripeUrl}/_fake/events`)).json()) as {
				deliveries: { eventId: string; type: string; url: string; status: number }[];
			};
			return deliveries
				.filter((d) => d.url === `${BASE_URL}/api/payments/webhook`)
				.slice(-3)
				.map((d) => `${d.type} ${d.status}`);
		})
		.toEqual([
			'payment_intent.succeeded 200',
			'checkout.session.completed 200',
			'checkout.session.completed 200'
		]);

	// Receipt and notice, once each.
	const receipt = await waitForMessage({ to: email, subject: /receipt/, timeoutMs: 10_000 });
	expect(receipt.text).toContain('€7.50');
	await waitForMessage({ to: AUTHOR, subject: /tipped you/, timeoutMs: 10_000 });
	await reader.waitForTimeout(1_000);
	const messages = await listMessages();
	expect(messages.filter((m) => m.to.includes(email) && /receipt/.test(m.subject))).toHaveLength(1);
	expect(messages.filter((m) => m.to.includes(AUTHOR) && m.text.includes(token))).toHaveLength(1);

	// The author's earnings: one more tip, €7.50 more, in euros.
	const after = await earningsIn(author, 'EUR');
	expect(after.count).toBe(before.count + 1);
	const euros = (text: string) => Number(text.replace(/[^\d.]/g, '') || '0');
	expect(Math.round((euros(after.text) - euros(before.text)) * 100)).toBe(750);
	await expect(author.getByRole('img', { name: /Paid tips per month in EUR/ })).toBeVisible();
	const csv = await (await author.request.get('/my/earnings/export.csv')).text();
	expect(csv.split('\n').filter((line) => line.includes('Noor Tipper'))).toHaveLength(1);
	expect(csv).toMatch(/,Noor Tipper,EUR,7\.50,[\d.]+,paid/);

	// The ledger as admins see it: one row for this reader, paid.
	const admin = await newPage(browser, 1280);
	await signInWithPassword(admin, ADMIN);
	await admin.goto('/admin/tips');
	const rows = admin.getByRole('row').filter({ hasText: email });
	await expect(rows).toHaveCount(1);
	await expect(rows.first()).toContainText('✓ Paid');
	await expect(rows.first()).toContainText('€7.50');

	// The public note is on the guide page, once.
	await reader.goto(`/guides/${GUIDE}`);
	await expect(reader.getByText(token)).toHaveCount(1);

	// An admin refunds it: the ledger and the author's earnings follow.
	admin.once('dialog', (dialog) => void dialog.accept());
	await rows.first().getByRole('button', { name: 'Refund' }).click();
	await expect(admin.getByText('Refunded €7.50.')).toBeVisible();
	await expect(admin.getByRole('row').filter({ hasText: email })).toContainText('↺ Refunded');
	await waitForMessage({ to: email, subject: /was refunded/, timeoutMs: 10_000 });
	const refunded = await earningsIn(author, 'EUR');
	expect(refunded.count).toBe(before.count);
});

test('the tip form and the earnings page fit a 390 px phone', async ({ browser }) => {
	test.setTimeout(90_000);
	const reader = await newPage(browser, 390);
	await signInWithPassword(reader, 'reader@slotwise.test');
	await reader.goto(`/guides/${GUIDE}/tip?currency=JPY`);
	await expect(reader.getByText('¥500')).toBeVisible();
	await noSidewaysScroll(reader);
	// A yen has no smaller unit: a fraction is refused with a clear message.
	await reader.getByLabel('Another amount').check();
	await reader.getByLabel('Your amount, if another').fill('500.5');
	await reader.getByRole('button', { name: 'Continue to payment' }).click();
	await expect(reader.getByText('JPY has no smaller unit: enter a whole number.')).toBeVisible();
	await noSidewaysScroll(reader);

	const author = await newPage(browser, 390);
	await signInWithPassword(author, AUTHOR);
	await author.goto('/my/earnings');
	await expect(author.getByRole('heading', { name: 'Earnings from tips' })).toBeVisible();
	await noSidewaysScroll(author);
	expect(await severeViolations(author)).toEqual([]);
});
