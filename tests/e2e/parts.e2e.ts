import { expect, test } from '@playwright/test';
import {
	demoGuides,
	demoParts,
	demoQuotes,
	demoRegions,
	DRIFT,
	DRIFT_STORE,
	demoStores
} from '../../src/lib/server/db/seeders/demo-data';

/*
 * The public catalog in a real browser on the seeded demo: filter by category, open a
 * part, read its specs with units, the price history chart and its data table.
 */

const gpus = demoParts.filter((p) => p.category === 'gpu');
const cobalt = demoParts.find((p) => p.slug === 'solenne-cobalt-c6-8g');

function currencyOfStore(storeName: string): string {
	const store = demoStores.find((s) => s.name === storeName);
	return demoRegions.find((r) => r.code === store?.regionCode)?.currency ?? '?';
}

test('the catalog filters by category, and a part page shows specs, prices and history', async ({
	page
}) => {
	if (!cobalt) throw new Error('demo part missing');
	// Client-side navigation must render too, not only the server's HTML.
	const pageErrors: string[] = [];
	page.on('pageerror', (e) => pageErrors.push(e.message));
	await page.goto('/parts');
	await expect(page.getByRole('heading', { level: 1, name: 'Parts catalog' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'Parts', exact: true })).toHaveAttribute(
		'aria-current',
		'page'
	);

	await page
		.getByRole('navigation', { name: 'Part categories' })
		.getByRole('link', { name: 'Graphics card' })
		.click();
	await expect(page).toHaveURL(/category=gpu/);
	await expect(page.getByText(`${gpus.length} parts`)).toBeVisible();
	const rows = page.getByRole('table').getByRole('row');
	await expect(rows).toHaveCount(gpus.length + 1); // + header row
	for (const gpu of gpus)
		await expect(page.getByRole('link', { name: `${gpu.brand} ${gpu.model}` })).toBeVisible();

	// A spec filter through the form: at most 210 mm keeps only the short cards.
	await page.getByLabel('Length, at most (mm)').fill('210');
	await page.getByRole('button', { name: 'Search' }).click();
	const short = gpus.filter((g) => Number(g.specs.lengthMm) <= 210);
	await expect(
		page.getByText(short.length === 1 ? '1 part' : `${short.length} parts`)
	).toBeVisible();
	await expect(rows).toHaveCount(short.length + 1);

	await page.getByRole('link', { name: `${cobalt.brand} ${cobalt.model}` }).click();
	await expect(page).toHaveURL(/\/parts\/solenne-cobalt-c6-8g$/);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(
		`${cobalt.brand} ${cobalt.model}`
	);

	// Units come from the field names: lengthMm → mm, boardPowerW → W, vramGb → GB.
	const specs = page.getByRole('table', { name: 'Specifications with units' });
	await expect(specs.getByRole('row', { name: /Length/ })).toContainText(
		`${cobalt.specs.lengthMm} mm`
	);
	await expect(specs.getByRole('row', { name: /Board power/ })).toContainText(
		`${cobalt.specs.boardPowerW} W`
	);
	await expect(specs.getByRole('row', { name: /Video memory/ })).toContainText(
		`${cobalt.specs.vramGb} GB`
	);

	// One chart (svg role=img) per currency where some store was seen more than once: a single
	// observation per store is a line of text, not a history.
	const quotes = [
		...demoQuotes,
		// The upkeep demo's price drift adds a quote or two at one German store.
		...DRIFT.map((d) => ({ partSlug: d.part, storeName: DRIFT_STORE }))
	].filter((q) => q.partSlug === cobalt.slug);
	const seen = new Map<string, number>();
	for (const q of quotes) seen.set(q.storeName, (seen.get(q.storeName) ?? 0) + 1);
	const charted = new Set(
		quotes.filter((q) => (seen.get(q.storeName) ?? 0) > 1).map((q) => currencyOfStore(q.storeName))
	);
	expect(charted.has('USD')).toBe(true);
	const charts = page.getByRole('img', { name: /Price history of Solenne Cobalt C6/ });
	await expect(charts).toHaveCount(charted.size);
	const usd = page.getByRole('img', { name: /Prices in USD/ });
	await expect(usd).toBeVisible();
	await expect(usd).toHaveAttribute(
		'aria-label',
		/Prices in USD at 1 store, 5 observations from .+ Lowest US\$229\.99/
	);
	// Each observation has a marker: a path with its own tooltip title.
	await expect(usd.locator('path title')).toHaveCount(5);

	// The data table fallback lists every point of the USD chart (five at one store).
	await page.getByText(/Data table: \d+ prices in USD/).click();
	const table = page.getByRole('table', { name: /Every observed price in USD/ });
	await expect(table).toBeVisible();
	const usdQuotes = quotes.filter((q) => currencyOfStore(q.storeName) === 'USD');
	await expect(table.getByRole('row')).toHaveCount(usdQuotes.length + 1);
	await expect(table).toContainText('US$229.99');

	// The guides using it (as a pick or an alternate) link to their pages.
	const using = demoGuides.filter((g) =>
		g.slots.some(
			(s) => s.pickSlug === cobalt.slug || s.alternates.some((a) => a.partSlug === cobalt.slug)
		)
	);
	expect(using.length).toBeGreaterThan(0);
	const guidesSection = page.getByRole('region', { name: 'Guides using this part' });
	for (const guide of using) {
		await expect(guidesSection.getByRole('link', { name: guide.title })).toHaveAttribute(
			'href',
			`/guides/${guide.slug}`
		);
	}
	expect(pageErrors).toEqual([]);
});

test('the catalog works without JavaScript, and an unknown part answers 404', async ({
	browser
}) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await page.goto('/parts?category=cpu');
	await page.getByLabel('Brand or model').fill('halvard');
	await page.getByLabel('Socket').selectOption('AM5');
	await page.getByRole('button', { name: 'Search' }).click();
	await expect(page).toHaveURL(/socket=AM5/);
	const expected = demoParts.filter(
		(p) => p.category === 'cpu' && p.brand === 'Halvard' && p.specs.socket === 'AM5'
	);
	await expect(page.getByRole('table').getByRole('row')).toHaveCount(expected.length + 1);

	// A bad filter is reported and ignored; the rest of the search still applies.
	await page.goto('/parts?category=gpu&maxLengthMm=5000&q=cobalt');
	await expect(page.getByText('Length must be at most 1,000 mm.')).toBeVisible();
	await expect(page.getByRole('table')).toContainText('Cobalt');

	const response = await page.goto('/parts/no-such-part');
	expect(response?.status()).toBe(404);
	await context.close();
});

test('the JSON API answers searches, refuses bad parameters and 404s unknown parts', async ({
	request
}) => {
	const ok = await request.get('/api/v1/parts?category=gpu&minVramGb=16');
	expect(ok.status()).toBe(200);
	const body = await ok.json();
	expect(body.total).toBe(gpus.filter((g) => Number(g.specs.vramGb) >= 16).length);
	expect(body).toMatchObject({ page: 1, pageCount: 1 });

	const bad = await request.get('/api/v1/parts?category=gpu&maxLengthMm=5000&colour=red');
	expect(bad.status()).toBe(400);
	const problem = await bad.json();
	expect(problem.message).toEqual(expect.any(String));
	expect(Object.keys(problem.issues).sort()).toEqual(['_form', 'maxLengthMm']);

	const missing = await request.get('/api/v1/parts/no-such-part');
	expect(missing.status()).toBe(404);
	expect(await missing.json()).toEqual({ message: expect.any(String) });
});
