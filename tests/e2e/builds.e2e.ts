import { expect, test } from '@playwright/test';
import type { Browser, Page } from '@playwright/test';
import { parse } from 'csv-parse/sync';
import { severeViolations, signInWithPassword } from './support';

/*
 * Builds in Chromium against the production build: a reader forks a seeded guide, swaps the
 * graphics card to an alternate, changes region, marks two parts bought and sees the progress
 * bar; the guide's author publishes a newer revision (approved by an editor); the reader syncs
 * with one conflict, chooses, and the build is right; the CSV export carries the right totals.
 * The guide is the demo's balanced 1440p build, which no other end-to-end test reads.
 */

const READER = 'reader@slotwise.test';
const AUTHOR = 'mira.falkenberg@slotwise.test';
const EDITOR = 'editor@slotwise.test';
const GUIDE = 'balanced-1440p-am5';

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

const slot = (page: Page, label: string) =>
	page.getByRole('listitem', { name: label, exact: true });

interface DraftSlot {
	slotKey: string;
	category: string;
	label: string;
	quantity: number;
	pickPartId: number;
	pick: { slug: string };
	reason: string;
	priceQuote: unknown;
	alternates: { partId: number; part: { slug: string }; reasonTag: string; note: string }[];
}

/** The author moves the graphics card pick to the faster alternate and the power supply to the bigger one, and submits. */
async function authorPublishesRevision(author: Page) {
	const draft = await (await author.request.get(`/api/v1/guides/${GUIDE}/draft`)).json();
	const promote = (s: DraftSlot, slug: string) => {
		const chosen = s.alternates.find((a) => a.part.slug === slug);
		if (!chosen) throw new Error(`${slug} is not an alternate of ${s.label}`);
		return {
			...s,
			pickPartId: chosen.partId,
			priceQuote: null,
			alternates: [
				{ partId: s.pickPartId, reasonTag: 'lower_price', note: 'The previous pick.' },
				...s.alternates.filter((a) => a.partId !== chosen.partId)
			]
		};
	};
	const slots = (draft.slots as DraftSlot[]).map((s) =>
		s.label === 'Graphics card'
			? promote(s, 'ironvale-auric-a78-16g')
			: s.label === 'Power supply'
				? promote(s, 'voltren-vp850-gold')
				: s
	);
	const body = {
		version: draft.version,
		title: draft.title,
		summary: draft.summary,
		targetBudget: draft.targetBudget,
		baseRegion: draft.baseRegion,
		tags: draft.tags,
		disclosure: draft.disclosure,
		disclosureNote: draft.disclosureNote,
		walkthroughUrl: draft.walkthroughUrl,
		buildNotes: draft.buildNotes,
		// Each slot goes back with its key, so the new revision has the same slots.
		slots: slots.map((s) => ({
			slotKey: s.slotKey,
			category: s.category,
			label: s.label,
			quantity: s.quantity,
			pickPartId: s.pickPartId,
			reason: s.reason,
			priceQuote: s.priceQuote,
			alternates: s.alternates.map((a) => ({
				partId: a.partId,
				reasonTag: a.reasonTag,
				note: a.note
			}))
		}))
	};
	const saved = await author.request.put(`/api/v1/guides/${GUIDE}/draft`, { data: body });
	expect(saved.status(), await saved.text()).toBe(200);
	const submitted = await author.request.post(`/api/v1/guides/${GUIDE}/submit`, {
		data: { version: (await saved.json()).version }
	});
	expect(submitted.status()).toBe(200);
}

test('fork, swap, re-price, track purchases, then sync a newer revision with one conflict and export', async ({
	browser
}) => {
	test.setTimeout(180_000);
	const reader = await signedIn(browser, READER);
	await reader.goto(`/guides/${GUIDE}`);
	await reader.getByRole('button', { name: 'Fork into my build' }).click();
	await expect(reader).toHaveURL(/\/builds\/\d+$/);
	const buildUrl = new URL(reader.url()).pathname;
	await expect(reader.getByRole('heading', { level: 1 })).toContainText('(my build)');
	await expect(slot(reader, 'Graphics card').getByTestId('slot-part')).toHaveText(/Cobalt C7/);
	const buildViolations = await severeViolations(reader);
	expect(buildViolations, buildViolations.join('\n')).toEqual([]);

	// Swap the graphics card to the cheaper alternate in one click.
	const gpu = slot(reader, 'Graphics card');
	await gpu.locator('summary', { hasText: /^Swap \(/ }).click();
	await gpu.getByRole('button', { name: /Use this for Graphics card: .*Auric A64/ }).click();
	await expect(reader.getByText('Swapped.')).toBeVisible();
	await expect(slot(reader, 'Graphics card').getByTestId('slot-part')).toHaveText(/Auric A64/);
	await expect(reader.getByTestId('drift')).toContainText('Graphics card');

	// A second tab still holds the old version: its edit is refused, nothing is overwritten.
	const secondTab = await reader.context().newPage();
	await secondTab.goto(buildUrl);
	await reader.reload();
	await slot(reader, 'Memory').locator('summary', { hasText: 'Other part' }).click();
	await slot(reader, 'Memory').getByLabel('Quantity').fill('2');
	await slot(reader, 'Memory').getByRole('button', { name: 'Set quantity' }).click();
	await expect(reader.getByText('Quantity saved.')).toBeVisible();
	await slot(secondTab, 'Memory').locator('summary', { hasText: 'Other part' }).click();
	await slot(secondTab, 'Memory').getByLabel('Quantity').fill('3');
	await slot(secondTab, 'Memory').getByRole('button', { name: 'Set quantity' }).click();
	await expect(secondTab.getByText(/changed in another tab or window/)).toBeVisible();
	await secondTab.close();
	await reader.reload();
	await expect(slot(reader, 'Memory')).toContainText('× 2');
	await slot(reader, 'Memory').locator('summary', { hasText: 'Other part' }).click();
	await slot(reader, 'Memory').getByLabel('Quantity').fill('1');
	await slot(reader, 'Memory').getByRole('button', { name: 'Set quantity' }).click();
	await expect(reader.getByText('Quantity saved.')).toBeVisible();

	// The reader's region: US dollars, before tax.
	await reader.getByLabel('Your region').selectOption('us');
	await reader.getByRole('button', { name: 'Save settings' }).click();
	await expect(reader.getByText('Saved.')).toBeVisible();
	await expect(reader.getByText(/prices in United States \(USD\)/)).toBeVisible();
	await expect(reader.getByTestId('build-total')).toContainText('US$');

	// Two parts bought: the CPU at the planned price, the case at a price paid.
	for (const [label, paid] of [
		['CPU', ''],
		['Case', '99.00']
	] as const) {
		const item = slot(reader, label);
		await item.locator('summary', { hasText: 'Mark bought' }).click();
		if (paid) await item.getByLabel(/^Paid/).fill(paid);
		await item.getByRole('button', { name: `Save purchase (${label})` }).click();
		await expect(reader.getByText('Marked bought.')).toBeVisible();
		await expect(slot(reader, label).getByTestId('bought')).toBeVisible();
	}
	const progress = reader.getByTestId('purchase-progress');
	await expect(progress).toContainText('2 parts bought');
	const value = Number(await progress.locator('progress').getAttribute('value'));
	const max = Number(await progress.locator('progress').getAttribute('max'));
	expect(value).toBeGreaterThan(0);
	expect(value).toBeLessThan(max);

	// The author publishes a newer revision; an editor approves it.
	const author = await signedIn(browser, AUTHOR);
	await authorPublishesRevision(author);
	const editor = await signedIn(browser, EDITOR);
	await editor.goto('/review');
	await editor
		.getByTestId('review-queue')
		.getByRole('link', { name: /A balanced 1440p build/ })
		.click();
	await editor.getByRole('button', { name: 'Publish', exact: true }).click();
	await editor.getByRole('button', { name: 'Yes, publish now' }).click();
	await expect(editor.getByText('Published: this revision is now live.')).toBeVisible();

	// The reader sees the new revision and syncs: the graphics card is a conflict, the PSU is offered.
	await reader.goto(buildUrl);
	await expect(reader.getByTestId('newer-revision')).toBeVisible();
	const sync = reader.getByTestId('sync');
	// "Not now" first: the answer is stored and the offer folds away, still there to reopen.
	await sync.getByRole('button', { name: /^Not now: keep revision \d+$/ }).click();
	await expect(
		reader.getByText(/^Your build stays on revision \d+\. Revision \d+ stays offered/)
	).toBeVisible();
	await expect(sync.getByTestId('sync-declined')).toContainText(
		/You chose not to take revision \d+ \(on \d{4}-\d{2}-\d{2}\)/
	);
	await expect(sync.getByRole('button', { name: /^Not now/ })).toHaveCount(0);
	await reader.reload();
	await expect(sync.getByTestId('sync-declined')).toBeVisible();
	await expect(reader.getByTestId('newer-revision')).toHaveCount(0);
	await sync.getByText('Show the update again').click();
	const conflict = sync.locator('[data-testid="sync-row"][data-status="conflict"]');
	await expect(conflict).toHaveCount(1);
	await expect(conflict).toContainText('Graphics card');
	const syncViolations = await severeViolations(reader);
	expect(syncViolations, syncViolations.join('\n')).toEqual([]);
	await expect(sync.locator('[data-testid="sync-row"][data-status="upstream_only"]')).toContainText(
		'Power supply'
	);
	// Without a choice for the conflict the browser refuses to submit; choose to keep ours.
	await conflict.getByLabel('Keep yours').check();
	await sync.getByRole('button', { name: 'Update from the guide', exact: true }).click();
	await expect(reader.getByText(/^Updated from the guide:/)).toBeVisible();
	await expect(slot(reader, 'Graphics card').getByTestId('slot-part')).toHaveText(/Auric A64/);
	await expect(slot(reader, 'Power supply').getByTestId('slot-part')).toHaveText(/VP850/);
	await expect(reader.getByTestId('newer-revision')).toHaveCount(0);
	await expect(slot(reader, 'CPU').getByTestId('bought')).toBeVisible();
	// The undo offer says which update it would undo, as a sentence with its spaces.
	await expect(reader.getByTestId('undo-sync')).toContainText(
		/Last updated from the guide, from revision \d+ to \d+\./
	);

	// The CSV shopping list: one row per slot, and totals that add up to what the page shows.
	const csv = await reader.request.get(`${buildUrl}/export.csv`);
	expect(csv.status()).toBe(200);
	expect(csv.headers()['content-type']).toContain('text/csv');
	const rows = parse(await csv.text(), { columns: true, skip_empty_lines: true }) as Record<
		string,
		string
	>[];
	const slotRows = rows.filter((r) => r.slot && r.part);
	const sumMinor = slotRows.reduce((sum, r) => sum + Math.round(Number(r['line total']) * 100), 0);
	const planned = rows.find((r) => r.slot === 'Planned total');
	expect(planned?.currency).toBe('USD');
	expect(Math.round(Number(planned?.['line total']) * 100)).toBe(sumMinor);
	const pageTotal = (await reader.getByTestId('build-total').innerText()).replace(/[^0-9.]/g, '');
	expect(Number(planned?.['line total'])).toBeCloseTo(Number(pageTotal), 2);
	expect(slotRows.find((r) => r.slot === 'Case')?.paid).toBe('99.00');
	for (const page of [reader, author, editor]) await page.context().close();
});

test('an owner adds a slot and swaps its part: searched with JavaScript, typed by name or slug without it; the page carries no catalog', async ({
	browser
}) => {
	test.setTimeout(90_000);
	const reader = await signedIn(browser, READER);
	const forked = await reader.request.post('/api/v1/guides/quiet-4k-play-and-work/fork', {
		data: {}
	});
	expect(forked.status()).toBe(201);
	const { id } = (await forked.json()) as { id: number };
	const buildUrl = `/builds/${id}`;

	// The owner's page names the build's parts, not the catalog: a CPU this build does not use
	// (the demo's Halvard Strata 606X) is nowhere in it.
	const html = await (await reader.request.get(buildUrl)).text();
	expect(html).toContain('orrin-labs-meridian-765kf');
	expect(html).not.toContain('halvard-strata-606x');
	expect(html).not.toContain('Strata 606X');

	// With JavaScript: the part is searched as you type and chosen with the keyboard.
	await reader.goto(buildUrl);
	await reader.locator('summary', { hasText: 'Add a slot' }).click();
	const add = reader.locator('form[action="?/addSlot"]');
	await add.getByLabel('Category').selectOption('storage');
	await add.getByLabel('Label').fill('Scratch drive');
	const part = add.getByRole('combobox', { name: 'Part' });
	await part.fill('no such drive');
	await expect(add.getByRole('listbox').getByText('No matching part.')).toBeVisible();
	await part.press('Escape');
	await expect(add.getByRole('listbox')).toHaveCount(0);
	await part.fill('c4 1');
	await expect(add.getByRole('option', { name: 'Cindral C4 1 TB', exact: true })).toBeVisible();
	await part.press('ArrowDown');
	await part.press('Enter');
	await expect(add.getByTestId('chosen-part')).toHaveText('Cindral C4 1 TB');
	await add.getByRole('button', { name: 'Add slot' }).click();
	await expect(reader.getByText('Slot added.')).toBeVisible();
	await expect(slot(reader, 'Scratch drive').getByTestId('slot-part')).toHaveText(
		'Cindral C4 1 TB'
	);
	// The swap's search answers parts of the slot's category; each is a button.
	const scratch = slot(reader, 'Scratch drive');
	await scratch.locator('summary', { hasText: 'Other part' }).click();
	await scratch.getByLabel('Find another part').fill('c4 2');
	await scratch.getByRole('button', { name: 'Cindral C4 2 TB for Scratch drive' }).click();
	await expect(reader.getByText('Swapped.')).toBeVisible();
	await expect(slot(reader, 'Scratch drive').getByTestId('slot-part')).toHaveText(
		'Cindral C4 2 TB'
	);

	// Without JavaScript: the part is typed; the server looks it up when the form is posted.
	const context = await browser.newContext({ javaScriptEnabled: false });
	const plain = await context.newPage();
	await signInWithPassword(plain, READER);
	await plain.goto(buildUrl);
	await plain.locator('summary', { hasText: 'Add a slot' }).click();
	const form = plain.locator('form[action="?/addSlot"]');
	await form.getByLabel('Category').selectOption('storage');
	await form.getByLabel('Label').fill('Archive drive');
	await form.getByLabel('Part', { exact: true }).fill('cindral');
	await form.getByRole('button', { name: 'Add slot' }).click();
	// Four Cindral drives (demo catalog): listed by model, with their slugs; nothing typed is lost.
	const refused = plain.locator('form[action="?/addSlot"]');
	await expect(
		refused.getByText(
			'Several parts match "cindral": Cindral C3 1 TB (cindral-c3-1tb), Cindral C4 1 TB (cindral-c4-1tb), Cindral C4 2 TB (cindral-c4-2tb), Cindral C5 2 TB (cindral-c5-2tb); type more of the name.'
		)
	).toBeVisible();
	await expect(refused.getByLabel('Part', { exact: true })).toHaveValue('cindral');
	await expect(refused.getByLabel('Label')).toHaveValue('Archive drive');
	await expect(refused.getByLabel('Category')).toHaveValue('storage');
	await refused.getByLabel('Part', { exact: true }).fill('cindral-c5-2tb');
	await refused.getByRole('button', { name: 'Add slot' }).click();
	await expect(plain.getByText('Slot added.')).toBeVisible();
	await expect(slot(plain, 'Archive drive').getByTestId('slot-part')).toHaveText('Cindral C5 2 TB');

	const archive = slot(plain, 'Archive drive');
	await archive.locator('summary', { hasText: 'Other part' }).click();
	await archive.getByLabel('Another part').fill('halvard-strata-606');
	await archive.getByRole('button', { name: 'Use this part' }).click();
	const after = slot(plain, 'Archive drive');
	await expect(
		after.getByText('Halvard Strata 606 (halvard-strata-606) is in the category CPU, not Storage.')
	).toBeVisible();
	await expect(after.getByLabel('Another part')).toHaveValue('halvard-strata-606');
	await after.getByLabel('Another part').fill('verrow s2');
	await after.getByRole('button', { name: 'Use this part' }).click();
	await expect(plain.getByText('Swapped.')).toBeVisible();
	await expect(slot(plain, 'Archive drive').getByTestId('slot-part')).toHaveText(
		'Verrow S2 2 TB SATA'
	);
	await context.close();
	await reader.context().close();
});
