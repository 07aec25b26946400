import { expect, test } from '@playwright/test';
import { severeViolations, signInWithPassword } from './support';

/*
 * A price sighting end to end in Chromium: the demo reader reports a price on a part page,
 * the demo editor verifies it at /editor/sightings, and the part's price history (its data
 * table) shows the new quote. The part, store and amount are ones no other test asserts on:
 * the Arkwell M790 ATX has no demo guide and no demo quote at Bayline PC Supply. The amount
 * differs per run so a re-run on the same database reports a new price instead of merging.
 */
const PART = '/parts/arkwell-m790-atx';
const STORE = 'Bayline PC Supply';

test('a reader reports a price, an editor verifies it, and it joins the price history', async ({
	browser
}) => {
	// Three browser sessions and two axe runs (10–15 s each on a busy test machine).
	test.setTimeout(180_000);
	const cents = 15_000 + (Date.now() % 4_000) * 7 + 3; // between 150.03 and 439.96 USD
	const price = `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
	const label = new Intl.NumberFormat('en-GB', { style: 'currency', currency: 'USD' }).format(
		cents / 100
	);
	const today = new Date().toISOString().slice(0, 10);

	// A visitor is asked to sign in instead of seeing the form.
	const visitor = await browser.newContext();
	const visitorPage = await visitor.newPage();
	await visitorPage.goto(PART);
	await expect(visitorPage.getByRole('link', { name: 'Sign in to report a price' })).toBeVisible();
	await expect(visitorPage.locator('form[action="?/reportPrice"]')).toHaveCount(0);
	await visitor.close();

	const readerContext = await browser.newContext();
	const reader = await readerContext.newPage();
	await signInWithPassword(reader, 'reader@slotwise.test');
	await reader.goto(PART);

	// Bad input first: three decimals for US dollars is refused with a message on the field.
	await reader.locator('#sighting-region').selectOption('us');
	await reader.locator('#sighting-store').selectOption({ label: STORE });
	await reader.locator('#sighting-price').fill(`${price}5`);
	await reader.locator('#sighting-day').fill(today);
	await reader
		.locator('#sighting-url')
		.fill('https://bayline-pc-supply.example/boards/arkwell-m790-atx');
	await reader.getByRole('button', { name: 'Report this price' }).click();
	await expect(reader.locator('#sighting-price-issues')).toContainText(
		'USD allows at most 2 decimals'
	);
	await expect(reader.locator('#sighting-price')).toHaveAttribute('aria-invalid', 'true');
	const formViolations = await severeViolations(reader);
	expect(formViolations, formViolations.join('\n')).toEqual([]);

	await reader.locator('#sighting-price').fill(price);
	await reader.getByRole('button', { name: 'Report this price' }).click();
	await expect(
		reader.getByRole('status').filter({ hasText: 'waiting for an editor' })
	).toBeVisible();
	const mine = reader.getByTestId('my-sightings');
	await expect(mine.locator('li', { hasText: label })).toContainText('Waiting for an editor');

	const editorContext = await browser.newContext();
	const editor = await editorContext.newPage();
	await signInWithPassword(editor, 'editor@slotwise.test');
	await editor.goto('/editor');
	await editor
		.getByRole('navigation', { name: 'Editor' })
		.getByRole('link', { name: 'Price sightings' })
		.click();
	await expect(editor).toHaveURL(/\/editor\/sightings$/);
	await editor.getByLabel('Part', { exact: true }).fill('Arkwell M790');
	await editor.getByRole('button', { name: 'Filter' }).click();
	const item = editor
		.getByTestId('sighting-item')
		.filter({ hasText: label })
		.filter({ hasText: STORE });
	await expect(item).toHaveCount(1);
	const queueViolations = await severeViolations(editor);
	expect(queueViolations, queueViolations.join('\n')).toEqual([]);
	await item.getByRole('button', { name: 'Verify' }).click();
	await expect(editor.getByRole('status').filter({ hasText: 'Verified' })).toBeVisible();
	await expect(editor.getByTestId('sighting-item').filter({ hasText: label })).toHaveCount(0);

	// The price history's data table lists the new quote under its store.
	await editor.goto(PART);
	const history = editor.locator('section', {
		has: editor.getByRole('heading', { name: 'Price history' })
	});
	// With one price per store so far (a fresh demo), the page lists it as a line of text; once
	// a store has a history (earlier runs on the same database), it is a chart with a data table.
	const once = history.getByTestId('price-once').filter({ hasText: 'Prices in USD' });
	if ((await once.count()) > 0) {
		await expect(once.locator('li', { hasText: STORE }).filter({ hasText: label })).toHaveCount(1);
	} else {
		await history.locator('summary', { hasText: 'in USD' }).click();
		const row = history
			.locator('tr', { hasText: `United States · ${STORE}` })
			.filter({ hasText: label });
		await expect(row).toHaveCount(1);
		await expect(row.locator('time')).toHaveAttribute('datetime', `${today}T12:00:00.000Z`);
	}

	// The reader sees the decision in their own list.
	await reader.goto(PART);
	await expect(mine.locator('li', { hasText: label })).toContainText('Verified');

	await readerContext.close();
	await editorContext.close();
});

test('without JavaScript: a reader reports a price and sees the editor’s reason for rejecting it', async ({
	browser
}) => {
	test.setTimeout(90_000);
	const cents = 45_001 + (Date.now() % 4_000) * 3; // 450.01 … 570.00 USD: apart from the test above
	const price = `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
	const label = new Intl.NumberFormat('en-GB', { style: 'currency', currency: 'USD' }).format(
		cents / 100
	);
	const reason = `The linked page shows a different board (run ${Date.now()}).`;

	const readerContext = await browser.newContext({ javaScriptEnabled: false });
	const reader = await readerContext.newPage();
	await signInWithPassword(reader, 'reader@slotwise.test');
	await reader.goto(PART);
	await reader.locator('#sighting-region').selectOption('us');
	await reader.locator('#sighting-store').selectOption({ label: STORE });
	await reader.locator('#sighting-price').fill(price);
	await reader
		.locator('#sighting-url')
		.fill('https://bayline-pc-supply.example/boards/arkwell-m790-atx?ref=shelf');
	await reader.getByRole('button', { name: 'Report this price' }).click();
	await expect(
		reader.getByRole('status').filter({ hasText: 'waiting for an editor' })
	).toBeVisible();

	const editorContext = await browser.newContext({ javaScriptEnabled: false });
	const editor = await editorContext.newPage();
	await signInWithPassword(editor, 'editor@slotwise.test');
	await editor.goto('/editor/sightings?q=Arkwell+M790&region=us');
	const item = editor.getByTestId('sighting-item').filter({ hasText: label });
	await expect(item).toHaveCount(1);
	await item.getByLabel('Reason for rejecting').fill(reason);
	await item.getByRole('button', { name: 'Reject' }).click();
	await expect(editor.getByRole('status').filter({ hasText: 'Rejected' })).toBeVisible();
	await expect(editor.getByTestId('sighting-item').filter({ hasText: label })).toHaveCount(0);

	await reader.goto(PART);
	const mine = reader.getByTestId('my-sightings').locator('li', { hasText: label });
	await expect(mine).toContainText('Rejected');
	await expect(mine).toContainText(reason);

	// The rejected price never reaches the price history.
	await expect(
		reader.locator('section', { has: reader.getByRole('heading', { name: 'Price history' }) })
	).not.toContainText(label);

	await readerContext.close();
	await editorContext.close();
});
