import { expect, test } from '@playwright/test';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';
import { severeViolations } from './support';

/*
 * axe-core (WCAG 2.0–2.2 A and AA rules) on the main public pages: no violation of impact
 * "serious" or "critical". Failures list each rule with the selectors it flagged.
 */
const PAGES = [
	{ name: 'home', path: '/' },
	{ name: 'browse', path: '/guides' },
	{ name: 'browse with filters', path: '/guides?region=de&max=1&sort=total' },
	{ name: 'guide page', path: `/guides/${demoGuides[0]?.slug ?? ''}` },
	{ name: 'guide page in another region', path: `/guides/${demoGuides[0]?.slug ?? ''}?region=de` },
	{ name: 'parts catalog', path: '/parts' },
	{ name: 'part page', path: '/parts/solenne-cobalt-c6-8g' },
	{ name: 'help', path: '/help' },
	{ name: 'help: regional pricing', path: '/help/regional-pricing' },
	{ name: 'help: API reference', path: '/help/api' },
	{ name: 'newsletter', path: '/newsletter' },
	{ name: 'author page', path: '/authors/priya-lindqvist' }
];

for (const { name, path } of PAGES) {
	test(`axe finds no serious or critical violation: ${name}`, async ({ page }) => {
		const response = await page.goto(path);
		expect(response?.status()).toBe(200);
		const severe = await severeViolations(page);
		expect(severe, severe.join('\n')).toEqual([]);
	});
}
