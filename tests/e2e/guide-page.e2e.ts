import { expect, test } from '@playwright/test';
import { demoResults } from '../../src/lib/server/db/seeders/demo-data/results';

/*
 * The public guide page beyond prices: fit report with counts, power budget, safety
 * cautions, frame chart with its table, value, reproducibility, build notes, and region
 * re-pricing in place with JavaScript (the no-JS path is covered in guides.e2e.ts).
 */

const SLUG = 'steady-1080p-starter'; // base region US (demo-data/guides.ts)

test('the guide page shows fit report counts, power budget, safety cautions, frame results and value', async ({
	page
}) => {
	await page.goto(`/guides/${SLUG}`);
	const fit = page.getByTestId('fit-report');
	await expect(fit.getByRole('heading', { name: 'Fit report' })).toBeVisible();
	await expect(fit.getByTestId('fit-counts')).toHaveText(/\d+ conflicts? · \d+ cautions? · \d+ ok/);
	// Each finding carries its word, not colour alone; passed checks open from their count.
	await fit.getByTestId('fit-ok').locator('summary').click();
	await expect(fit.getByText(/^(ok|caution|conflict)$/).first()).toBeVisible();

	const power = page.getByTestId('power-budget');
	await expect(power.getByText('Estimated load')).toBeVisible();
	await expect(power.getByText(/^\d+ W$/).first()).toBeVisible();

	const safety = page.getByTestId('safety');
	await expect(safety).toContainText('unplug the computer from mains power');
	await expect(safety).toContainText('Never open a power supply');
	await expect(safety).toContainText('12V-2x6');
	await expect(safety).toContainText('static');
	await expect(safety).toContainText('sharp edges');
	await expect(safety).toContainText('Local electrical codes');
	await expect(page.getByTestId('build-notes')).toBeVisible();

	const frames = page.getByTestId('frame-results');
	const chart = frames.getByTestId('frame-chart');
	await expect(chart).toBeVisible();
	const seeded = demoResults[SLUG]?.frames ?? [];
	expect(seeded.length).toBeGreaterThan(0);
	await expect(chart.locator('rect')).toHaveCount(seeded.length);
	// The 1 % low ticks and written values make the chart readable without colour.
	await expect(chart.locator('line')).toHaveCount(seeded.length + 1);
	await frames.getByText('Frame results as a table').click();
	const table = frames.getByTestId('frame-table');
	for (const r of seeded)
		await expect(table.getByRole('row', { name: new RegExp(r.workload) })).toContainText(
			(r.avgFpsTenths / 10).toFixed(1)
		);

	const value = page.getByTestId('value');
	await expect(value.getByText('FPS per 100 USD')).toBeVisible();
	await expect(value.getByTestId('cost-per-frame')).toHaveText(/\$\d+\.\d{2}/);
	await expect(page.getByTestId('reproducibility').getByRole('listitem').first()).toBeVisible();
	await expect(page.getByTestId('drop-in').first()).toContainText(
		/fits as a drop-in|fits with a caution|does not fit/
	);
	await expect(page.getByTestId('thermals').getByRole('table')).toBeVisible();
});

test('with JavaScript, switching USD → EUR re-prices totals and line labels without a reload', async ({
	page
}) => {
	await page.goto(`/guides/${SLUG}`);
	await page.waitForLoadState('networkidle');
	const receipt = page.getByRole('complementary');
	const total = receipt.getByTestId('picks-total');
	await expect(total).toContainText('$');
	const firstLabel = page.getByTestId('line-label').first();
	await expect(firstLabel).toContainText('Quoted');
	const labelBefore = (await firstLabel.textContent())?.trim() ?? '';
	const firstLine = page.getByTestId('line-total').first();
	await expect(firstLine).toContainText('$');

	// A marker on window survives only if the document is not reloaded.
	await page.evaluate(() => ((window as unknown as { __noReload: boolean }).__noReload = true));
	const documents: string[] = [];
	page.on('request', (r) => {
		if (r.resourceType() === 'document') documents.push(r.url());
	});
	const pricing = page.waitForResponse((r) =>
		r.url().includes(`/api/v1/guides/${SLUG}/pricing?region=de`)
	);
	await receipt.getByLabel('Show prices for').selectOption('de');
	expect((await pricing).status()).toBe(200);

	await expect(total).toContainText('€');
	// Every pick of this guide is quoted by a German store (demo-data/quotes.ts): the line
	// shows euros and its label names the German store instead of the US one.
	await expect(firstLine).toContainText('€');
	await expect(firstLabel).not.toHaveText(labelBefore);
	await expect(firstLabel).toContainText('Quoted');
	await expect(page.getByTestId('value').getByText('FPS per 100 EUR')).toBeVisible();
	await expect(page.getByTestId('reproducibility')).toContainText('Germany');
	expect(
		await page.evaluate(() => (window as unknown as { __noReload?: boolean }).__noReload)
	).toBe(true);
	expect(documents, 'document requests after the switch').toEqual([]);
	await expect(page).toHaveURL(/\?region=de$/);
});

test('build notes render the stored, sanitised HTML only', async ({ page }) => {
	await page.goto(`/guides/${SLUG}`);
	const notes = page.getByTestId('build-notes');
	await expect(notes.locator('script, iframe, [onerror], [onclick]')).toHaveCount(0);
	expect(
		await page.evaluate(() => (window as unknown as { __xss?: unknown }).__xss)
	).toBeUndefined();
});

test('the revision history compares revisions with a GET form and rejects bad numbers', async ({
	page
}) => {
	await page.goto(`/guides/${SLUG}?from=1&to=abc`);
	const history = page.getByTestId('revision-history');
	await expect(history).toContainText('Revision 1');
	const response = await page.goto(`/guides/${SLUG}?from=1&to=7`);
	expect(response?.status()).toBe(200);
});
