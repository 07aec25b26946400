import { expect, test } from '@playwright/test';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';

/*
 * Guide browse on the seeded demo (4 published guides): the GET form filters without
 * JavaScript, bad parameters are reported and dropped, and the API answers the same
 * filters. Paging by 12 is covered in tests/integration/guide-browse.spec.ts, which can
 * publish 27 guides without disturbing the shared e2e database.
 */

test('filters by region, budget and tags with JavaScript off', async ({ browser }) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await page.goto('/guides');
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Browse guides');
	await expect(page.getByTestId('browse-count')).toHaveText(`${demoGuides.length} guides`);

	// Every 1440p gaming guide, priced in Germany, lowest total first.
	await page.getByLabel('Price in region').selectOption('de');
	await page.getByRole('checkbox', { name: '1440p' }).check();
	await page.getByLabel('Sort by').selectOption('total');
	await page.getByRole('button', { name: 'Show guides' }).click();
	await expect(page).toHaveURL(/region=de/);
	await expect(page).toHaveURL(/tag=1440p/);
	const with1440 = demoGuides.filter((g) => g.tags.includes('1440p'));
	await expect(page.getByRole('article')).toHaveCount(with1440.length);
	const totals = await page.getByTestId('browse-total').allInnerTexts();
	expect(totals.every((t) => t.includes('€'))).toBe(true);
	const amounts = totals.map((t) => Number(t.replace(/[^0-9.]/g, '')));
	expect(amounts).toEqual([...amounts].sort((a, b) => a - b));

	// A budget up to the cheapest total (rounded up to whole euros) keeps only that guide.
	await page.getByLabel(/Budget up to/).fill(String(Math.ceil(amounts[0] ?? 0)));
	await page.getByRole('button', { name: 'Show guides' }).click();
	await expect(page.getByRole('article')).toHaveCount(1);
	await expect(page.getByTestId('browse-count')).toHaveText('1 guide');

	// Nothing under one euro: the empty state with a way out.
	await page.getByLabel(/Budget up to/).fill('1');
	await page.getByRole('button', { name: 'Show guides' }).click();
	await expect(page.getByText('No guide matches these filters.')).toBeVisible();
	await page.getByRole('link', { name: 'clear the filters' }).click();
	await expect(page.getByTestId('browse-count')).toHaveText(`${demoGuides.length} guides`);
	await context.close();
});

test('a bad parameter is reported beside its field and dropped; the rest still applies', async ({
	page
}) => {
	await page.goto('/guides?base=uk&page=zero');
	await expect(page.getByRole('alert')).toContainText('The page must be a whole number.');
	const fromUk = demoGuides.filter((g) => g.baseRegionCode === 'uk');
	await expect(page.getByRole('article')).toHaveCount(fromUk.length);
	await expect(page.getByRole('link', { name: fromUk[0]?.title ?? '' })).toBeVisible();
	await page.goto('/guides?region=zz');
	await expect(page.getByText('No region "zz"; showing guides from every region.')).toBeVisible();
});

test('the header links to browse, and page two past the end shows the empty state', async ({
	page
}) => {
	await page.goto('/');
	await page
		.getByRole('navigation', { name: 'Main' })
		.getByRole('link', { name: 'Guides' })
		.click();
	await expect(page).toHaveURL(/\/guides$/);
	await expect(page.getByRole('link', { name: 'Guides', exact: true })).toHaveAttribute(
		'aria-current',
		'page'
	);
	await page.goto('/guides?page=2');
	await expect(page.getByText('No guide matches these filters.')).toBeVisible();
});

test('GET /api/v1/guides pages and filters; bad input is a 400 with issues', async ({
	request
}) => {
	const all = await request.get('/api/v1/guides');
	expect(all.status()).toBe(200);
	const body = (await all.json()) as {
		items: { slug: string }[];
		total: number;
		page: number;
		pageCount: number;
	};
	expect([body.total, body.page, body.pageCount]).toEqual([demoGuides.length, 1, 1]);

	const bad = await request.get('/api/v1/guides?max=abc&sort=cheap');
	expect(bad.status()).toBe(400);
	const issues = ((await bad.json()) as { issues: Record<string, string[]> }).issues;
	expect(Object.keys(issues).sort()).toEqual(['max', 'sort']);
	// A budget without the region it is in cannot be compared with any total.
	const noRegion = await request.get('/api/v1/guides?max=900');
	expect(noRegion.status()).toBe(400);
	expect(Object.keys(((await noRegion.json()) as { issues: object }).issues)).toEqual(['max']);

	expect((await request.get('/api/v1/guides?region=zz')).status()).toBe(400);
	const slug = demoGuides[0]?.slug ?? '';
	const one = await request.get(`/api/v1/guides/${slug}?region=de`);
	expect(one.status()).toBe(200);
	expect(((await one.json()) as { region: { currency: string } }).region.currency).toBe('EUR');
	expect((await request.get(`/api/v1/guides/${slug}?region=zz`)).status()).toBe(400);
	expect((await request.get('/api/v1/guides/no-such-guide')).status()).toBe(404);
});

test('the Atom feed is linked from every page and lists the published guides', async ({
	page,
	request
}) => {
	await page.goto('/');
	const href = await page
		.locator('link[rel="alternate"][type="application/atom+xml"]')
		.getAttribute('href');
	expect(href).toBe('/guides/feed.xml');
	const feed = await request.get('/guides/feed.xml');
	expect(feed.headers()['content-type']).toBe('application/atom+xml; charset=utf-8');
	const { parseFeed } = await import('@rowanmanning/feed-parser');
	const parsed = parseFeed(await feed.text());
	expect(parsed.items.map((i) => i.title).sort()).toEqual(demoGuides.map((g) => g.title).sort());
});

// Issue 15: a budget we could not apply must not be answered with every guide under the message.
for (const [what, address, message] of [
	[
		'a budget that is not a number',
		'/guides?base=uk&max=abc',
		'The highest budget must be a whole number.'
	],
	['a budget without a region', '/guides?max=900', 'Choose the region your budget is in'],
	[
		'a lowest budget above the highest',
		'/guides?region=de&min=2000&max=1000',
		'The highest budget must be at least the lowest.'
	]
] as const) {
	test(`${what} lists no guides, only the message and a way out`, async ({ page }) => {
		await page.goto(address);
		await expect(page.getByText(message).first()).toBeVisible();
		await expect(page.getByTestId('browse-blocked')).toBeVisible();
		await expect(page.getByRole('article')).toHaveCount(0);
		await page.getByRole('link', { name: 'browse every guide' }).click();
		await expect(page.getByTestId('browse-count')).toHaveText(`${demoGuides.length} guides`);
	});
}
