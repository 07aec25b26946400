import { expect, test } from '@playwright/test';
import { THREE_BAD_ROWS, generatedCsv } from '../support/parts-csv';
import { signInWithPassword } from './support';

/*
 * The editor's CSV import through the real form, as the demo editor: a 200-row file with
 * 3 bad rows is previewed with exactly those rows and nothing is written; the fixed file
 * is previewed, confirmed, and all 200 parts appear at once.
 */

// Unique per run: the e2e database keeps rows between runs.
const PREFIX = `e2e${Date.now().toString(36)}`;

function file(name: string, text: string) {
	return { name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') };
}

/** How many parts of this run the editor's parts list finds ("200 parts, page 1 of 4" → 200). */
async function partCount(page: import('@playwright/test').Page): Promise<number> {
	await page.goto(`/editor/parts?q=${PREFIX}`);
	const text =
		(await page
			.getByText(/^\d+ parts?\b/)
			.first()
			.textContent()) ?? '';
	return Number(/^(\d+)/.exec(text.trim())?.[1] ?? NaN);
}

test('an editor imports 200 parts: 3 bad rows block the import, the fixed file goes in at once', async ({
	page
}) => {
	await signInWithPassword(page, 'editor@slotwise.test');

	await page.goto('/editor');
	await page
		.getByRole('navigation', { name: 'Editor' })
		.getByRole('link', { name: 'Parts' })
		.click();
	await page.getByRole('link', { name: 'Import CSV' }).click();
	await expect(page.getByRole('heading', { name: 'Import parts from CSV' })).toBeVisible();

	await page
		.getByLabel('CSV file')
		.setInputFiles(file('parts-with-mistakes.csv', generatedCsv(200, PREFIX, THREE_BAD_ROWS)));
	await page.getByRole('button', { name: 'Upload and preview' }).click();

	await expect(
		page.getByRole('heading', { name: 'Preview of parts-with-mistakes.csv: nothing was imported' })
	).toBeVisible();
	await expect(page.getByText('3 rows need fixing')).toBeVisible();
	await expect(page.getByRole('status').filter({ hasText: 'rows are good' })).toContainText(
		'197 of 200 rows are good'
	);
	const problems = page.getByRole('table', { name: 'Problems by row' }).locator('tbody tr');
	await expect(problems).toHaveCount(3);
	await expect(problems.nth(0)).toContainText('20');
	await expect(problems.nth(0)).toContainText('specs_json');
	await expect(problems.nth(0)).toContainText('lengthMm: Must be more than 0.');
	await expect(problems.nth(1)).toContainText('87');
	await expect(problems.nth(1)).toContainText('category');
	await expect(problems.nth(1)).toContainText('"toaster"');
	await expect(problems.nth(2)).toContainText('150');
	await expect(problems.nth(2)).toContainText('brand');
	await expect(problems.nth(2)).toContainText('formulas');

	// Nothing was written.
	expect(await partCount(page)).toBe(0);

	await page.goto('/editor/parts/import');
	await page
		.getByLabel('CSV file')
		.setInputFiles(file('parts-fixed.csv', generatedCsv(200, PREFIX)));
	await page.getByRole('button', { name: 'Upload and preview' }).click();
	await expect(page).toHaveURL(/\/editor\/parts\/import\?id=[0-9a-f-]{36}$/);
	const previewUrl = page.url();
	await expect(page.getByText('✓ All 200 rows are good')).toBeVisible();
	await expect(page.getByRole('table', { name: 'Rows to import' }).locator('tbody tr')).toHaveCount(
		200
	);
	// Still nothing written before the confirmation.
	expect(await partCount(page)).toBe(0);

	await page.goto(previewUrl);
	await page.getByRole('button', { name: 'Import 200 rows' }).click();
	await expect(page.getByText('Imported: 200 new parts, 0 updated, 0 unchanged.')).toBeVisible();

	expect(await partCount(page)).toBe(200);
	await page.goto(`/editor/parts?q=${PREFIX}-3&category=gpu`);
	await page.getByRole('link', { name: /Arclight 3, Dual "OC"/ }).click();
	await expect(page.getByRole('heading', { name: 'Arclight 3, Dual "OC"' })).toBeVisible();
	await expect(page.getByLabel('Length (mm)')).toHaveValue('243');

	// The export has the new parts, with formula-like cells neutralised (none here).
	const exported = await page.request.get('/editor/parts/export.csv');
	expect(exported.status()).toBe(200);
	expect(exported.headers()['content-type']).toBe('text/csv; charset=utf-8');
	expect(await exported.text()).toContain(`${PREFIX}-150,`);
});
