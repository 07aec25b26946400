import { expect, test } from '@playwright/test';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';

/* Reading the demo: home, a guide page, a missing guide. Every request must stay on the
 * app's own host: fonts, styles and scripts are shipped with the app. */

function watchHosts(page: import('@playwright/test').Page) {
	const foreign: string[] = [];
	page.on('request', (request) => {
		const url = new URL(request.url());
		if (url.protocol === 'data:') return;
		if (url.hostname !== '127.0.0.1') foreign.push(request.url());
	});
	return foreign;
}

test('home lists the published guides, and a guide page shows slots, alternates and prices', async ({
	page
}) => {
	const foreign = watchHosts(page);
	const fonts: string[] = [];
	page.on('response', (response) => {
		if (response.request().resourceType() === 'font') fonts.push(response.url());
	});

	await page.goto('/');
	for (const guide of demoGuides) {
		// A featured guide is listed under both New and Featured.
		await expect(page.getByRole('link', { name: guide.title }).first()).toBeVisible();
	}

	const first = demoGuides[0];
	if (!first) throw new Error('no demo guide');
	await page.getByRole('link', { name: first.title }).first().click();
	await expect(page).toHaveURL(new RegExp(`/guides/${first.slug}$`));
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(first.title);

	const slotsTable = page.getByRole('table').first();
	await expect(slotsTable).toBeVisible();
	// Every slot's label is listed, and at least one alternate is shown beneath its slot.
	for (const slot of first.slots) {
		await expect(slotsTable.getByText(slot.label, { exact: true }).first()).toBeVisible();
	}
	const firstAlternate = first.slots[0]?.alternates[0];
	if (firstAlternate) await expect(page.getByText(firstAlternate.note).first()).toBeVisible();
	// Prices carry the base region's currency formatting with digits.
	await expect(slotsTable.getByText(/\d[\d,]*(\.\d+)?/).first()).toBeVisible();

	await page.waitForLoadState('networkidle');
	expect(fonts.length, 'Inter and Merriweather are served by the app').toBeGreaterThan(0);
	expect(foreign, 'requests that left 127.0.0.1').toEqual([]);
});

test('a missing guide answers 404 with a readable page', async ({ page }) => {
	const response = await page.goto('/guides/no-such-guide');
	expect(response?.status()).toBe(404);
	await expect(page.getByText('404')).toBeVisible();
	await expect(page.getByRole('link', { name: /home|guides/i }).first()).toBeVisible();
});

test('the help pages render highlighted code samples on the API page, not the landing page', async ({
	page
}) => {
	const foreign = watchHosts(page);
	// Operator instructions live in the README; the code samples are on the API help page.
	await page.goto('/help');
	await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
	await expect(page.locator('main')).not.toContainText('curl');
	await page.goto('/help/api');
	await expect(page.locator('pre.shiki').first()).toBeVisible();
	expect(foreign).toEqual([]);
});

test('the region switcher re-prices a guide and labels lines quoted or estimated (works without JavaScript)', async ({
	browser
}) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await page.goto('/guides/pocket-itx-1440p');
	const receipt = page.getByRole('complementary');
	await expect(receipt.getByText(/JP¥/).first()).toBeVisible();
	await expect(page.getByText('Estimated', { exact: true })).toHaveCount(0);

	await receipt.getByLabel('Show prices for').selectOption('de');
	await receipt.getByRole('button', { name: 'Show' }).click();
	await expect(page).toHaveURL(/\?region=de$/);
	await expect(receipt.getByText(/€/).first()).toBeVisible();
	await expect(receipt.getByTestId('priced-counts')).toContainText(
		/\d+ quoted · [1-9]\d* estimated/
	);
	const table = page.getByRole('table').first();
	await expect(table.getByText('Estimated', { exact: true }).first()).toBeVisible();
	await expect(table.getByText('Quoted', { exact: true }).first()).toBeVisible();
	await expect(receipt.getByText(/reference rates of/)).toBeVisible();

	// A US guide (pre-tax USD) switched to Germany without JavaScript: euro totals with VAT.
	await page.goto('/guides/steady-1080p-starter');
	await expect(receipt.getByText(/US\$/).first()).toBeVisible();
	await receipt.getByLabel('Show prices for').selectOption('de');
	await receipt.getByRole('button', { name: 'Show' }).click();
	await expect(page).toHaveURL(/steady-1080p-starter\?region=de$/);
	await expect(receipt.getByText(/€/).first()).toBeVisible();
	await expect(receipt.getByText('Shelf prices include 19% tax')).toBeVisible();

	// An unknown region code falls back to the base region with a message, never a 500.
	const response = await page.goto('/guides/pocket-itx-1440p?region=zz');
	expect(response?.status()).toBe(200);
	await expect(page.getByRole('alert')).toContainText('no region');
	await context.close();
});

test('GET /api/v1/guides/[slug]/pricing re-prices without a page load', async ({ request }) => {
	const response = await request.get('/api/v1/guides/pocket-itx-1440p/pricing?region=uk');
	expect(response.status()).toBe(200);
	const body = await response.json();
	expect(body.region.code).toBe('uk');
	expect(body.picksTotal.currency).toBe('GBP');
	const bad = await request.get('/api/v1/guides/pocket-itx-1440p/pricing?region=zz');
	expect(bad.status()).toBe(400);
	expect((await request.get('/api/v1/guides/pocket-itx-1440p/pricing?region=d3')).status()).toBe(
		400
	);
});
