import { chromium } from '@playwright/test';
const origin = process.argv[2];
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium' });
for (const width of [1280, 390]) {
	const context = await browser.newContext({ viewport: { width, height: 900 } });
	const page = await context.newPage();
	const errors = [];
	page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
	for (const [name, path] of [['home', '/'], ['home-again', '/'], ['guide', '/guides/steady-1080p-starter'], ['guide-again', '/guides/steady-1080p-starter']]) {
		const response = await page.goto(`${origin}${path}`);
		console.log(width, name, response.status(), (await context.cookies()).length, 'cookies');
		await page.screenshot({ path: `/tmp/v-${name}-${width}.png` });
	}
	// Client-side navigation after a kept page: hydration works (links route without reload).
	await page.goto(`${origin}/`);
	await page.getByRole('link', { name: /guides/i }).first().click();
	await page.waitForURL(/\/guides/);
	console.log(width, 'navigated to', page.url(), 'console errors:', errors.length, errors.slice(0, 3));
	await context.close();
}
await browser.close();
