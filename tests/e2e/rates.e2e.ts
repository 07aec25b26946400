import { expect, test } from '@playwright/test';
import { signInWithPassword } from './support';

/*
 * Exchange rates: the app fetches the ECB's daily XML over HTTP from the local fake, which
 * serves the real published rates of 2 January 2024 (docs/sources.md 10c).
 */
test('GET /api/v1/fx lists the stored euro rates with their date and flags them stale', async ({
	request
}) => {
	const response = await request.get('/api/v1/fx');
	expect(response.status()).toBe(200);
	const body = (await response.json()) as {
		base: string;
		rates: { currency: string; ratePerEur: string; asOf: string; stale: boolean }[];
	};
	expect(body.base).toBe('EUR');
	const usd = body.rates.find((r) => r.currency === 'USD');
	// ECB, Euro foreign exchange reference rates, 2 January 2024: USD 1.0956 (V).
	expect(usd).toMatchObject({ ratePerEur: '1.0956', asOf: '2024-01-02', stale: true });
});

test('an editor refreshes the rates from the ECB feed', async ({ page }) => {
	await signInWithPassword(page, 'editor@slotwise.test');
	await page.goto('/editor/rates');
	await expect(page.getByRole('cell', { name: '155.68' })).toBeVisible();
	await page.getByRole('button', { name: "Fetch today's rates" }).click();
	await expect(page.getByRole('status')).toContainText('2024-01-02');
});
