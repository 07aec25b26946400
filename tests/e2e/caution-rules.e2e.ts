import { expect, test } from '@playwright/test';
import type { APIRequestContext, Page } from '@playwright/test';
import { severeViolations, signInWithPassword } from './support';

/*
 * Pairing cautions end to end: the demo editor writes a rule through the form (one refused
 * value first), POST /api/v1/fit shows it as a caution with the rule's text and author,
 * and deactivating it removes it again. The chip name is unique per run, so the rule fires
 * only on this test's own parts and leaves the demo guides' fit reports as they are.
 * The rule's advice is common practice, no published source.
 */
const RUN = `${Date.now()}`;
const CHIP = `Testline Q${RUN.slice(-6)}`;
const TITLE = `Q-series card with a quad-core CPU ${RUN}`;
const MESSAGE = `A ${CHIP} graphics card with fewer than six CPU cores: expect lower 1 % lows in busy scenes.`;

const cpu = {
	socket: 'AM5',
	cores: 4,
	threads: 8,
	baseClockGhz: 3.8,
	boostClockGhz: 4.8,
	tdpW: 65,
	memoryTypes: ['DDR5'],
	integratedGraphics: true,
	bundledCooler: true
};
const gpu = {
	chip: CHIP,
	vramGb: 16,
	lengthMm: 280,
	slotWidth: 2.5,
	boardPowerW: 220,
	powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
	pcieGen: 4
};

type Finding = {
	rule: string;
	severity: string;
	message: string;
	slots: string[];
	authorName?: string;
	cautionRuleId?: number;
};

async function fitFindings(request: APIRequestContext, cores: number): Promise<Finding[]> {
	const response = await request.post('/api/v1/fit', {
		data: {
			slots: [
				{
					key: 'cpu',
					category: 'cpu',
					brand: 'Tarnwick',
					model: 'Vela 41',
					specs: { ...cpu, cores, threads: cores * 2 }
				},
				{ key: 'gpu', category: 'gpu', brand: 'Ferrant', model: 'Kestrel Q', specs: gpu }
			]
		}
	});
	expect(response.status()).toBe(200);
	return ((await response.json()) as { findings: Finding[] }).findings;
}

async function fillCondition(
	page: Page,
	n: number,
	part: string,
	field: string,
	comparison: string,
	value: string
) {
	const row = page.getByRole('group', { name: `Condition ${n}` });
	await row.getByLabel('Part').selectOption({ label: part });
	await row.getByLabel('Spec field').selectOption({ label: field });
	await row.getByLabel('Comparison').selectOption({ label: comparison });
	await row.getByLabel('Value').fill(value);
}

test('an editor writes a pairing caution; the fit API shows it with text and author until it is deactivated', async ({
	page,
	request
}) => {
	await signInWithPassword(page, 'editor@slotwise.test');
	await page.goto('/editor');
	await page
		.getByRole('navigation', { name: 'Editor' })
		.getByRole('link', { name: 'Pairing cautions' })
		.click();
	await expect(page.getByRole('heading', { level: 1, name: 'Pairing cautions' })).toBeVisible();
	await page.getByRole('link', { name: 'New rule' }).click();

	await page.getByLabel('Title (editors only)').fill(TITLE);
	await page.getByLabel('Caution readers see').fill(MESSAGE);
	await fillCondition(page, 1, 'Graphics card', 'Chip', 'is', CHIP);
	await fillCondition(page, 2, 'CPU', 'Cores', 'is less than', 'six');
	await page.getByRole('button', { name: 'Add rule' }).click();

	// Refused with a message at the value; nothing else is lost.
	const second = page.getByRole('group', { name: 'Condition 2' });
	await expect(second.getByText('"six" is not a number; Cores is a number.')).toBeVisible();
	await expect(second.getByLabel('Value')).toHaveAttribute('aria-invalid', 'true');
	await expect(page.getByLabel('Title (editors only)')).toHaveValue(TITLE);
	expect((await fitFindings(request, 4)).filter((f) => f.message === MESSAGE)).toEqual([]);

	await second.getByLabel('Value').fill('6');
	await page.getByRole('button', { name: 'Add rule' }).click();
	await expect(page).toHaveURL(/\/editor\/cautions\?done=added$/);
	await expect(page.getByText('Rule added.')).toBeVisible();
	const card = page.getByTestId('caution-rule').filter({ hasText: TITLE });
	await expect(card).toContainText('By Dario Vesely');
	await expect(card).toContainText(`Graphics card chip is ${CHIP}; and CPU cores is less than 6`);

	// The fit API: a caution with the rule's text and author for four cores, none for six.
	const fired = (await fitFindings(request, 4)).filter((f) => f.message === MESSAGE);
	expect(fired).toHaveLength(1);
	expect(fired[0]).toMatchObject({
		severity: 'caution',
		authorName: 'Dario Vesely',
		slots: ['gpu', 'cpu']
	});
	expect((await fitFindings(request, 6)).filter((f) => f.message === MESSAGE)).toEqual([]);

	// Edit: the stored conditions come back in the form; a changed text shows at once.
	await card.getByRole('link', { name: /^Edit/ }).click();
	await expect(page.getByRole('group', { name: 'Condition 2' }).getByLabel('Value')).toHaveValue(
		'6'
	);
	await page.getByLabel('Caution readers see').fill(`${MESSAGE} Edited.`);
	await page.getByRole('button', { name: 'Save rule' }).click();
	await expect(page.getByText('Rule saved.')).toBeVisible();
	expect(
		(await fitFindings(request, 4)).filter((f) => f.message === `${MESSAGE} Edited.`)
	).toHaveLength(1);

	// Deactivate: the fit API stops showing it; the rule stays listed as off.
	await card.getByRole('button', { name: /^Deactivate/ }).click();
	await expect(page.getByText('Rule deactivated: fit reports no longer show it.')).toBeVisible();
	await expect(page.getByTestId('caution-rule').filter({ hasText: TITLE })).toContainText('Off');
	expect((await fitFindings(request, 4)).filter((f) => f.message.startsWith(MESSAGE))).toEqual([]);
});

test('the rule form works without JavaScript: plain selects and server messages', async ({
	browser
}) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await signInWithPassword(page, 'editor@slotwise.test');
	await page.goto('/editor/cautions/new');
	await page.getByLabel('Title (editors only)').fill(`No-JS check ${RUN}`);
	await page
		.getByLabel('Caution readers see')
		.fill('Checks the server refuses a comparison that does not fit the field.');
	// Without JavaScript every comparison is offered; "contains" on a number is refused by the server.
	await fillCondition(page, 1, 'CPU', 'Cores', 'contains', '4');
	await page.getByRole('button', { name: 'Add rule' }).click();
	const first = page.getByRole('group', { name: 'Condition 1' });
	await expect(first.getByText(/"contains" does not apply to Cores/)).toBeVisible();
	await expect(page.getByText('A pairing caution needs at least two conditions.')).toBeVisible();
	await context.close();
});

for (const path of ['/editor/cautions', '/editor/cautions/new', '/editor/cautions/1']) {
	test(`axe finds no serious or critical violation: ${path}`, async ({ page }) => {
		// axe on a full editor page can take a while on a busy machine.
		test.setTimeout(90_000);
		await signInWithPassword(page, 'editor@slotwise.test');
		const response = await page.goto(path);
		expect(response?.status()).toBe(200);
		const severe = await severeViolations(page);
		expect(severe, severe.join('\n')).toEqual([]);
	});
}
