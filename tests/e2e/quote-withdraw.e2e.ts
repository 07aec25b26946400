import { expect, test } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { connectToE2eDb, signInWithPassword } from './support';

/*
 * An editor withdraws a quote when a store stops selling the part (issue 19: a pick left with
 * no active quote in a region raises the "gone from the stores" upkeep alert, checked in
 * tests/integration/upkeep-alerts.spec.ts). The quote is one this test adds, far above any
 * demo price, so the demo's figures are the same before and after.
 */
test('an editor withdraws a quote from the latest quotes, after being asked, and the row says so', async ({
	page
}) => {
	const connection = await connectToE2eDb();
	const [rows] = await connection.query("SELECT id FROM stores WHERE name = 'Kairo Denki' LIMIT 1");
	await connection.end();
	const storeId = String((rows as { id: number }[])[0]?.id);

	await signInWithPassword(page, 'editor@slotwise.test');
	const added = await page.request.post('/editor/quotes?/create', {
		form: {
			partSlug: 'kelda-flatline-58',
			storeId,
			amount: '999000',
			taxIncluded: 'on',
			observedOn: new Date().toISOString().slice(0, 10)
		},
		headers: { origin: BASE_URL, accept: 'text/html' },
		maxRedirects: 0
	});
	expect(added.status()).toBe(303);

	await page.goto('/editor/quotes');
	const row = page.getByRole('row').filter({ hasText: '¥999,000' });
	await expect(row).toHaveCount(1);
	await row.getByText('Withdraw…').click();
	await expect(row.getByText('The store no longer sells it at this price.')).toBeVisible();
	await row.getByRole('button', { name: 'Withdraw quote' }).click();
	await expect(page.getByText('Quote withdrawn')).toBeVisible();
	await expect(
		page.getByRole('row').filter({ hasText: '¥999,000' }).getByText('withdrawn', { exact: true })
	).toBeVisible();

	// On a phone the table scrolls inside its frame; the page itself never scrolls sideways
	// (the hidden words in each row are positioned inside that frame).
	await page.setViewportSize({ width: 390, height: 900 });
	await page.goto('/editor/quotes');
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
