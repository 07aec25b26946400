import { expect, test } from '@playwright/test';
import type { Browser, Locator, Page } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { forgetCounts, signInWithPassword } from './support';

/*
 * The guide editor in Chromium against the production build and the seeded demo catalog:
 * an author writes a guide with 8 slots and alternates, watches the fit report react, previews
 * build notes, saves and submits; two windows on one guide get the "changed elsewhere"
 * conflict with both versions visible; the author JSON API keeps to owners and JSON.
 */

const AUTHOR = 'author@slotwise.test';

async function choosePart(combobox: Locator, query: string, option: string) {
	await combobox.fill(query);
	const listbox = combobox.page().getByRole('listbox');
	await expect(listbox.getByRole('option', { name: option, exact: true })).toBeVisible();
	await listbox.getByRole('option', { name: option, exact: true }).click();
}

async function addSlot(
	page: Page,
	index: number,
	category: string,
	label: string,
	query: string,
	option: string
) {
	await page.getByRole('button', { name: 'Add a slot' }).click();
	const slot = page.getByTestId('slot').nth(index);
	await slot.getByLabel('Category').selectOption({ label: category });
	await slot.getByLabel('Label', { exact: true }).fill(label);
	await choosePart(slot.getByRole('combobox', { name: 'Pick' }), query, option);
	await slot.getByLabel('Why this part').fill(`${label}: chosen for this build.`);
}

async function newGuide(page: Page, title: string): Promise<string> {
	await forgetCounts('guide_create_user');
	await page.goto('/my/guides');
	await page.getByRole('link', { name: 'New guide' }).click();
	await page.getByLabel('Title').fill(title);
	await page
		.getByLabel('Summary')
		.fill('An AM5 build for 1440p games, priced in US dollars before tax.');
	await page.getByLabel('Base region').selectOption('us');
	await page.getByLabel(/Target budget/).fill('1200');
	await page.getByLabel('gaming').check();
	await page.getByLabel('1440p').check();
	await page.getByLabel('No sponsorship and no affiliate links').check();
	await page.getByRole('button', { name: 'Create draft' }).click();
	await expect(page).toHaveURL(/\/my\/guides\/[a-z0-9-]+\/edit$/);
	return new URL(page.url()).pathname.split('/')[3] ?? '';
}

test('an author writes a guide with 8 slots and alternates, checks fit, previews, saves and submits', async ({
	page
}) => {
	test.setTimeout(90_000);
	await signInWithPassword(page, AUTHOR);
	const title = `Editor run ${Date.now()}`;
	await newGuide(page, title);

	await addSlot(page, 0, 'CPU', 'CPU', 'strata 606', 'Halvard Strata 606');
	await addSlot(page, 1, 'CPU cooler', 'Cooler', 'frostline 120', 'Tessel Frostline 120');
	await addSlot(page, 2, 'Motherboard', 'Board', 's650m', 'Vantor S650M Base');
	await addSlot(page, 3, 'Memory', 'Memory', 'flux 5600', 'Aldmere Flux DDR5-5600 2 × 16 GB');
	await addSlot(page, 4, 'Storage', 'Drive', 'c4 1', 'Cindral C4 1 TB');
	await addSlot(page, 5, 'Graphics card', 'Graphics', 'cobalt c6', 'Solenne Cobalt C6 Duo 8 GB');
	await addSlot(page, 6, 'Power supply', 'Power', 'vp650', 'Voltren VP650 Gold');
	await addSlot(page, 7, 'Case', 'Case', 'm mesh', 'Cairnhouse M Mesh');
	await expect(page.getByTestId('slot')).toHaveCount(8);

	const fit = page.getByTestId('fit-panel');
	// Source of the rule: docs/architecture.md Computations 3 (CPU socket vs motherboard).
	await expect(
		fit.locator('[data-severity="ok"]', { hasText: 'share the AM5 socket' })
	).toBeVisible();
	await expect(fit.getByTestId('fit-summary')).toContainText('0 conflicts');

	// An AM4 board under an AM5 CPU: the report turns to a conflict, with glyph and word.
	const board = page.getByTestId('slot').nth(2);
	await choosePart(board.getByRole('combobox', { name: 'Pick' }), 's550m', 'Arkwell S550M Daily');
	const conflict = fit.locator('[data-severity="conflict"]', { hasText: 'AM4 socket' });
	await expect(conflict).toBeVisible();
	await expect(conflict).toContainText('✕');
	await expect(conflict).toContainText('Conflict:');
	await choosePart(board.getByRole('combobox', { name: 'Pick' }), 's650m', 'Vantor S650M Base');
	await expect(fit.getByTestId('fit-summary')).toContainText('0 conflicts');

	// Alternates: two on the CPU (ranked), one on the graphics card, each with its drop-in status.
	const cpu = page.getByTestId('slot').nth(0);
	await cpu.getByRole('button', { name: 'Add an alternate to slot 1' }).click();
	await choosePart(
		cpu.getByRole('combobox', { name: 'Alternate part' }).nth(0),
		'strata 606x',
		'Halvard Strata 606X'
	);
	await cpu.getByLabel('Reason').nth(0).selectOption('upgrade_path');
	await cpu.getByLabel('Note').nth(0).fill('Faster clocks for the same board.');
	await cpu.getByRole('button', { name: 'Add an alternate to slot 1' }).click();
	await choosePart(
		cpu.getByRole('combobox', { name: 'Alternate part' }).nth(1),
		'strata 406',
		'Halvard Strata 406'
	);
	await cpu.getByLabel('Reason').nth(1).selectOption('lower_price');
	await expect(cpu.getByTestId('drop-in').nth(0)).toContainText('Drops in');
	await expect(cpu.getByTestId('drop-in').nth(1)).toContainText('Does not fit'); // AM4 CPU on an AM5 board
	await cpu.getByRole('button', { name: 'Rank alternate 2 higher' }).click();
	await expect(cpu.getByTestId('alternate').nth(0)).toContainText('Halvard Strata 406');
	const gpu = page.getByTestId('slot').nth(5);
	await gpu.getByRole('button', { name: 'Add an alternate to slot 6' }).click();
	await choosePart(
		gpu.getByRole('combobox', { name: 'Alternate part' }),
		'a52',
		'Ironvale Auric A52 Twin 8 GB'
	);
	await gpu.getByLabel('Reason').selectOption('easier_to_find');

	// Build notes preview: rendered on the server, raw HTML dropped.
	await page
		.getByLabel('Firmware setup checklist')
		.fill('- Enable the **memory profile**\n- <script>window.__xss = 1</script>Update firmware');
	await page.getByLabel('Cable routing').fill('Route the 24-pin behind the tray.');
	await page.getByRole('button', { name: 'Preview build notes' }).click();
	const preview = page.getByTestId('notes-preview');
	await expect(preview.locator('strong', { hasText: 'memory profile' })).toBeVisible();
	await expect(preview.getByRole('heading', { name: 'Cable routing' })).toBeVisible();
	await expect(preview.locator('script')).toHaveCount(0);
	expect(
		await page.evaluate(() => (window as unknown as { __xss?: number }).__xss)
	).toBeUndefined();

	await page.getByRole('button', { name: 'Save draft' }).click();
	await expect(page.getByText('Saved (revision 1).')).toBeVisible();

	// After a reload everything is stored: 8 slots in order, alternates in their new rank.
	await page.reload();
	await expect(page.getByTestId('slot')).toHaveCount(8);
	await expect(page.getByTestId('slot').nth(0).getByTestId('alternate').nth(0)).toContainText(
		'Halvard Strata 406'
	);
	await expect(page.getByLabel('Cable routing')).toHaveValue('Route the 24-pin behind the tray.');

	await page.getByRole('button', { name: 'Save and submit for review' }).click();
	await expect(page).toHaveURL(/\/my\/guides\?submitted=/);
	await expect(page.getByText('Submitted for review.')).toBeVisible();
	await expect(page.getByRole('article', { name: title }).getByTestId('guide-state')).toHaveText(
		'Waiting for an editor (revision 1)'
	);
});

async function authorPage(browser: Browser): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, AUTHOR);
	return page;
}

test('two windows on one guide: the second save gets "changed elsewhere" with both versions', async ({
	browser
}) => {
	const first = await authorPage(browser);
	const slug = await newGuide(first, `Conflict run ${Date.now()}`);
	await addSlot(first, 0, 'CPU', 'CPU', 'strata 606', 'Halvard Strata 606');
	await first.getByRole('button', { name: 'Save draft' }).click();
	await expect(first.getByText('Saved (revision 1).')).toBeVisible();

	const second = await authorPage(browser);
	await second.goto(`/my/guides/${slug}/edit`);
	await first.reload();

	await first.getByLabel('Summary').fill('Summary written in the first window.');
	await first.getByRole('button', { name: 'Save draft' }).click();
	await expect(first.getByText('Saved (revision 1).')).toBeVisible();

	await second.getByLabel('Summary').fill('Summary written in the second window.');
	await second.getByRole('button', { name: 'Save draft' }).click();
	const panel = second.getByTestId('conflict');
	await expect(panel).toContainText('Changed elsewhere');
	await expect(panel.getByTestId('conflict-mine')).toContainText(
		'Summary written in the second window.'
	);
	await expect(panel.getByTestId('conflict-stored')).toContainText(
		'Summary written in the first window.'
	);
	// Nothing lost: the second window's text is still in its form.
	await expect(second.getByLabel('Summary')).toHaveValue('Summary written in the second window.');
	await first.context().close();
	await second.context().close();
});

test('the author JSON API: JSON only, owner only, versioned, strict', async ({ browser }) => {
	const author = await authorPage(browser);
	// The author's guide-creation allowance (10 an hour) is spent by earlier suites.
	await forgetCounts('guide_create_user');
	const created = await author.request.post('/api/v1/guides', {
		data: {
			title: `API run ${Date.now()}`,
			summary: 'Through the API.',
			targetBudget: '800',
			baseRegion: 'us',
			tags: ['office'],
			disclosure: 'affiliate',
			disclosureNote: 'Store links pay a commission.'
		}
	});
	expect(created.status()).toBe(201);
	const { slug, version } = (await created.json()) as { slug: string; version: number };
	const draft = await (await author.request.get(`/api/v1/guides/${slug}/draft`)).json();
	expect(draft).toMatchObject({ slug, version, disclosure: 'affiliate', revisionNumber: 1 });

	const body = {
		title: draft.title,
		summary: draft.summary,
		targetBudget: '800',
		baseRegion: 'us',
		tags: ['office'],
		disclosure: 'affiliate',
		buildNotes: { firmware: '', assembly: 'Seat the CPU.', cabling: '', display: '' },
		slots: [{ category: 'cpu', label: 'CPU', quantity: 1, pickPartId: 0, reason: 'Efficient.' }]
	};
	// pickPartId 0 fails validation with a field message, never a 500.
	const bad = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { ...body, version }
	});
	expect(bad.status()).toBe(400);
	expect((await bad.json()).issues['slots.0.pickPartId']).toBeTruthy();
	const massAssigned = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { ...body, version, authorId: 'x', featured: true }
	});
	expect(massAssigned.status()).toBe(400);

	// Same-origin form body (so SvelteKit's CSRF check passes): the JSON-only hook refuses it.
	const notJson = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		form: { version: String(version) },
		headers: { origin: BASE_URL }
	});
	expect(notJson.status()).toBe(415);

	// The editor and a reader: another author's draft is a 404 (editor), no author role is a 403 (reader).
	const editor = await (await browser.newContext()).newPage();
	await signInWithPassword(editor, 'editor@slotwise.test');
	expect((await editor.request.get(`/api/v1/guides/${slug}/draft`)).status()).toBe(404);
	expect(
		(
			await editor.request.put(`/api/v1/guides/${slug}/draft`, { data: { ...body, version } })
		).status()
	).toBe(404);
	expect(
		(await editor.request.post(`/api/v1/guides/${slug}/submit`, { data: { version } })).status()
	).toBe(404);
	expect((await editor.request.get(`/my/guides/${slug}/edit`)).status()).toBe(404);
	const reader = await (await browser.newContext()).newPage();
	await signInWithPassword(reader, 'reader@slotwise.test');
	expect(
		(
			await reader.request.post('/api/v1/guides', {
				data: {
					title: 'Nope',
					summary: 's',
					targetBudget: '1',
					baseRegion: 'us',
					tags: [],
					disclosure: 'none'
				}
			})
		).status()
	).toBe(403);
	expect((await reader.request.get(`/api/v1/guides/${slug}/draft`)).status()).toBe(403);

	// A stale version: 409 with the stored copy.
	const slots = [{ ...body.slots[0], pickPartId: await cpuId(author) }];
	const ok = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { ...body, version, slots }
	});
	expect(ok.status()).toBe(200);
	const stale = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { ...body, version, slots, title: 'Stale' }
	});
	expect(stale.status()).toBe(409);
	const staleBody = await stale.json();
	expect(staleBody.message).toMatch(/changed elsewhere/);
	expect(staleBody.current.version).toBe(version + 1);
	const submitted = await author.request.post(`/api/v1/guides/${slug}/submit`, {
		data: { version: version + 1 }
	});
	expect(submitted.status()).toBe(200);
	expect(await submitted.json()).toMatchObject({ state: 'in_review', revisionState: 'submitted' });
});

/** A CPU's catalog id, from the author's own seeded guide (the parts API answers slugs). */
async function cpuId(page: Page): Promise<number> {
	const seeded = await page.request.get('/api/v1/guides/steady-1080p-starter/draft');
	expect(seeded.status()).toBe(200);
	const body = (await seeded.json()) as { slots: { category: string; pickPartId: number }[] };
	const cpu = body.slots.find((s) => s.category === 'cpu');
	expect(cpu).toBeTruthy();
	return cpu?.pickPartId ?? 0;
}

test('without JavaScript: slots are added and reordered by posting the form, and a save validates', async ({
	browser
}) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await signInWithPassword(page, AUTHOR);
	await forgetCounts('guide_create_user');
	await page.goto('/my/guides/new');
	await page.getByLabel('Title').fill(`No-script run ${Date.now()}`);
	await page.getByLabel('Summary').fill('Written with scripts off.');
	await page.getByLabel(/Target budget/).fill('500');
	await page.getByLabel('No sponsorship and no affiliate links').check();
	await page.getByRole('button', { name: 'Create draft' }).click();
	await expect(page).toHaveURL(/\/edit$/);

	await page.getByRole('button', { name: 'Add a slot' }).click();
	await page.getByRole('button', { name: 'Add a slot' }).click();
	await expect(page.getByTestId('slot')).toHaveCount(2);
	const [first, second] = [page.getByTestId('slot').nth(0), page.getByTestId('slot').nth(1)];
	await first.getByLabel('Label', { exact: true }).fill('First');
	// The page holds no catalog: a part is typed by name (or slug) and looked up on the server.
	await first.getByLabel('Pick').fill('strata 60');
	await second.getByLabel('Category').selectOption({ label: 'Case' });
	await second.getByLabel('Label', { exact: true }).fill('Second');
	await second.getByLabel('Pick').fill('m mesh');
	await page.getByRole('button', { name: 'Move slot 2 up' }).click();
	const [moved, kept] = [page.getByTestId('slot').nth(0), page.getByTestId('slot').nth(1)];
	await expect(moved.getByLabel('Label', { exact: true })).toHaveValue('Second');
	// "m mesh" names one case: it is chosen, by name, and the text field is free again.
	await expect(moved.getByTestId('chosen-part')).toHaveText('Cairnhouse M Mesh');
	await expect(moved.getByLabel('Pick')).toHaveValue('');
	// "strata 60" names several CPUs: the candidates are listed and the text is kept.
	await expect(
		kept.getByText(
			/^Several parts match "strata 60": .*Halvard Strata 606 \(halvard-strata-606\), Halvard Strata 606X \(halvard-strata-606x\).*; type more of the name\.$/
		)
	).toBeVisible();
	await expect(kept.getByLabel('Pick')).toHaveValue('strata 60');

	// A save validates: the slot with no single part keeps its message and everything typed.
	await page.getByRole('button', { name: 'Save draft' }).click();
	await expect(page.getByText('Check the highlighted fields.')).toBeVisible();
	await expect(kept.getByLabel('Label', { exact: true })).toHaveValue('First');
	await expect(kept.getByLabel('Pick')).toHaveValue('strata 60');
	await expect(kept.getByText(/^Several parts match "strata 60"/)).toBeVisible();

	// Enter in the field looks the text up (it never presses an add, move or remove button).
	await kept.getByLabel('Pick').fill('no such part here');
	await kept.getByLabel('Pick').press('Enter');
	await expect(page.getByTestId('slot')).toHaveCount(2);
	await expect(
		kept.getByText('No part matches "no such part here" in the category CPU.')
	).toBeVisible();
	await kept.getByLabel('Pick').fill('halvard-strata-606');
	await kept.getByLabel('Pick').press('Enter');
	await expect(kept.getByTestId('chosen-part')).toHaveText('Halvard Strata 606');

	await page.getByRole('button', { name: 'Remove slot 2' }).click();
	await expect(page.getByTestId('slot')).toHaveCount(1);
	await page.getByTestId('slot').nth(0).getByLabel('Why this part').fill('Small and cheap.');
	await page.getByRole('button', { name: 'Save draft' }).click();
	await expect(page.getByText('Saved (revision 1).')).toBeVisible();
	await expect(page.getByTestId('slot').nth(0).getByTestId('chosen-part')).toHaveText(
		'Cairnhouse M Mesh'
	);
	await context.close();
});

test('the editor page names only the parts its draft uses, not the whole catalog', async ({
	page
}) => {
	await signInWithPassword(page, AUTHOR);
	const answer = await page.request.get('/my/guides/steady-1080p-starter/edit');
	expect(answer.status()).toBe(200);
	const html = await answer.text();
	// The draft's CPU pick and one of its alternates are named (demo guide "steady-1080p-starter").
	expect(html).toContain('Halvard');
	expect(html).toContain('Strata 406');
	expect(html).toContain('halvard-strata-408');
	// A catalog CPU this draft does not use (the balanced 1440p guide's pick) is not in the page.
	expect(html).not.toContain('halvard-strata-606x');
	expect(html).not.toContain('Strata 606X');
});
