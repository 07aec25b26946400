import { expect, test } from '@playwright/test';
import type { Locator, Page } from '@playwright/test';
import sharp from 'sharp';
import {
	announcements,
	backdropOf,
	recordAnnouncements,
	severeViolations,
	signInWithPassword,
	signUpConfirmed,
	uniqueEmail
} from './support';

/*
 * Photos beyond the guide editor, in Chromium against the production build, at a desktop
 * width (1280 px) and a phone width (390 px): the seeded gallery and its lightbox, part
 * pictures in the parts list, on the part page and in a guide's slot, an editor adding a
 * picture to a part, and a reader's build carrying the guide's assembly checklist (stages,
 * photos, ticks) and photos of the finished build. The demo seed draws the pictures.
 */

const GUIDE = 'steady-1080p-starter'; // seeded gallery; its graphics card has a seeded picture
const PICTURED_PART = { slug: 'solenne-cobalt-c6-8g', name: 'Solenne Cobalt C6 Duo 8 GB' };
const WIDTHS = [1280, 390];

/** The page is no wider than the window: nothing forces sideways scrolling at this width. */
async function expectNoSidewaysScroll(page: Page) {
	const [scroll, inner] = await page.evaluate(() => [
		document.documentElement.scrollWidth,
		window.innerWidth
	]);
	expect(scroll, `page ${scroll} px wide in a ${inner} px window`).toBeLessThanOrEqual(inner);
}

/** The image really arrived and decoded (lazy images are scrolled to first). */
async function expectLoaded(img: Locator) {
	await img.scrollIntoViewIfNeeded();
	await expect
		.poll(() => img.evaluate((el) => (el as HTMLImageElement).naturalWidth))
		.toBeGreaterThan(0);
}

/** A drawn image (flat colour and a block), never a photograph. */
function drawnJpeg(background: string) {
	return sharp({ create: { width: 1200, height: 900, channels: 3, background } })
		.composite([
			{
				input: { create: { width: 400, height: 300, channels: 3, background: '#fbf8f3' } },
				left: 300,
				top: 200
			}
		])
		.jpeg({ quality: 85 })
		.toBuffer();
}

for (const width of WIDTHS) {
	test(`${width} px: the seeded gallery and its lightbox`, async ({ page }) => {
		await page.setViewportSize({ width, height: 900 });
		await page.goto(`/guides/${GUIDE}`);
		const gallery = page.getByRole('region', { name: 'Assembly photos' });
		const openers = gallery.getByRole('link', { name: /^Enlarge: / });
		const count = await openers.count();
		expect(count).toBeGreaterThanOrEqual(2);
		await expectLoaded(gallery.locator('img').first());
		await expectNoSidewaysScroll(page);

		await openers.first().click();
		const dialog = page.getByRole('dialog', { name: 'Assembly photos' });
		await expect(dialog).toBeVisible();
		await expect(dialog.getByTestId('lightbox-caption')).toContainText(`Photo 1 of ${count}`);
		await expectLoaded(dialog.locator('img').first());
		// The page behind is dimmed well (a dark veil, at least 70 % opaque) in both schemes,
		// so the enlarged photo stands out even on a phone.
		for (const colorScheme of ['light', 'dark'] as const) {
			await page.emulateMedia({ colorScheme });
			const backdrop = await backdropOf(dialog);
			expect(backdrop.alpha, `${colorScheme}: ${backdrop.colour}`).toBeGreaterThanOrEqual(0.7);
			expect(backdrop.luminance, `${colorScheme}: ${backdrop.colour}`).toBeLessThan(0.2);
		}
		await page.emulateMedia({ colorScheme: null });
		// The enlarged photo fits the window at this width.
		const box = await dialog.locator('img').first().boundingBox();
		expect(box?.width ?? Infinity).toBeLessThanOrEqual(width);
		await page.keyboard.press('ArrowRight');
		await expect(dialog.getByTestId('lightbox-caption')).toContainText(`Photo 2 of ${count}`);
		const violations = await severeViolations(page);
		expect(violations, violations.join('\n')).toEqual([]);
		await page.keyboard.press('Escape');
		await expect(dialog).toBeHidden();
		await expect(openers.first()).toBeFocused();
	});

	test(`${width} px: part pictures in the parts list, on the part page and in a guide's slot`, async ({
		page
	}) => {
		await page.setViewportSize({ width, height: 900 });
		await page.goto('/parts?category=gpu');
		const row = page
			.getByRole('row')
			.filter({ has: page.getByRole('link', { name: PICTURED_PART.name }) });
		await expect(row.locator('img')).toHaveCount(1);
		await expect(row.locator('img')).toHaveAttribute('src', /^\/media\/photos\//);
		await expectLoaded(row.locator('img'));
		// A part without a picture gets no empty frame.
		const bare = page
			.getByRole('row')
			.filter({ has: page.getByRole('link', { name: 'Solenne Auric A90 Triple 24 GB' }) });
		await expect(bare.locator('img')).toHaveCount(0);
		await expectNoSidewaysScroll(page);

		await page.goto(`/parts/${PICTURED_PART.slug}`);
		const pictures = page.getByRole('list', { name: `Pictures of ${PICTURED_PART.name}` });
		const picture = pictures.locator('img').first();
		await expect(picture).toHaveAttribute('alt', /\S/);
		await expectLoaded(picture);
		await expectNoSidewaysScroll(page);

		await page.goto(`/guides/${GUIDE}`);
		const slot = page.getByRole('rowgroup').filter({
			has: page.getByTestId('pick-name').filter({ hasText: 'Cobalt C6' })
		});
		await expectLoaded(slot.locator('img').first());
		await expectNoSidewaysScroll(page);
	});
}

test('an editor adds pictures to a catalog part, each with its own alt text, and deletes them after confirming', async ({
	browser
}) => {
	test.setTimeout(120_000);
	const editor = await (await browser.newContext()).newPage();
	await signInWithPassword(editor, 'editor@slotwise.test');
	const slug = 'solenne-auric-a64-12g';
	await editor.goto(`/editor/parts/${slug}`);
	const section = editor.locator('section', {
		has: editor.getByRole('heading', { name: 'Pictures' })
	});
	const input = section.getByTestId('photo-input');
	const alt = section.getByLabel(/^Alt text/);

	// Keyboard focus on the file picker shows a ring around its visible button (the input
	// itself is a visually hidden 1 px element).
	await section.getByLabel('Caption').focus();
	await editor.keyboard.press('Tab');
	await expect(input).toBeFocused();
	const ring = await input.evaluate((el) => {
		const style = getComputedStyle(el.closest('label') ?? el);
		return `${style.outlineStyle} ${style.outlineWidth}`;
	});
	expect(ring).toBe('solid 2px');

	// Each phase of an upload is said politely, not only its failure.
	await recordAnnouncements(section.getByTestId('upload-announcer'));
	await alt.fill('The card from above');
	await input.setInputFiles({
		name: 'card.jpg',
		mimeType: 'image/jpeg',
		buffer: await drawnJpeg('#3d4a5c')
	});
	await expect(section.getByTestId('upload-phase')).toHaveText('Done', { timeout: 60_000 });
	await expect(section.getByRole('img', { name: 'The card from above' })).toBeVisible();
	const said = (await announcements(editor)).join(' | ');
	expect(said).toMatch(/card\.jpg: uploading.*card\.jpg: processing.*card\.jpg: done/i);

	// One picture at a time, each with its own alt text: the field is empty again, and a
	// picture picked without alt text is not sent.
	await expect(alt).toHaveValue('');
	await input.setInputFiles({
		name: 'side.jpg',
		mimeType: 'image/jpeg',
		buffer: await drawnJpeg('#5c3d3d')
	});
	await expect(section.getByRole('alert')).toHaveText(/alt text/i);
	await expect(section.getByTestId('upload')).toHaveCount(1);
	await alt.fill('The card from the side');
	await input.setInputFiles({
		name: 'side.jpg',
		mimeType: 'image/jpeg',
		buffer: await drawnJpeg('#5c3d3d')
	});
	await expect(section.getByTestId('upload-phase').nth(1)).toHaveText('Done', { timeout: 60_000 });
	await expect(section.getByRole('img', { name: 'The card from the side' })).toBeVisible();

	const visitor = await (await browser.newContext()).newPage();
	await visitor.goto(`/parts/${slug}`);
	await expectLoaded(visitor.getByRole('img', { name: 'The card from above' }));
	await visitor.goto('/parts?category=gpu');
	const row = visitor
		.getByRole('row')
		.filter({ has: visitor.getByRole('link', { name: 'Solenne Auric A64 Duo 12 GB' }) });
	await expectLoaded(row.locator('img'));

	// Delete them again (the demo stays as it was). Each delete control names its picture,
	// and nothing goes before the confirmation.
	await section.getByText('Delete photo 1: The card from above…', { exact: true }).click();
	await expect(section.getByRole('img', { name: 'The card from above' })).toBeVisible();
	await section.getByRole('button', { name: 'Yes, delete photo 1' }).click();
	await expect(section.getByRole('img', { name: 'The card from above' })).toHaveCount(0);
	await section.getByText('Delete photo 1: The card from the side…', { exact: true }).click();
	await section.getByRole('button', { name: 'Yes, delete photo 1' }).click();
	await expect(section.getByRole('img', { name: 'The card from the side' })).toHaveCount(0);
	await visitor.goto(`/parts/${slug}`);
	await expect(visitor.getByRole('img', { name: 'The card from above' })).toHaveCount(0);
	for (const page of [editor, visitor]) await page.context().close();
});

test('390 px: a reader forks the guide, follows its assembly checklist, and shows the finished build', async ({
	browser
}) => {
	test.setTimeout(180_000);
	const page = await (await browser.newContext()).newPage();
	await page.setViewportSize({ width: 390, height: 900 });
	await signUpConfirmed(
		page,
		'Rowan Checklist',
		uniqueEmail('checklist'),
		'a long enough passphrase 42'
	);
	await page.goto(`/guides/${GUIDE}`);
	await page.getByRole('button', { name: 'Fork into my build' }).click();
	await expect(page).toHaveURL(/\/builds\/\d+$/);

	const checklist = page.getByTestId('assembly-checklist');
	const stages = checklist.getByTestId('checklist-stage');
	const total = await stages.count();
	expect(total).toBeGreaterThanOrEqual(3);
	await expect(checklist.getByTestId('checklist-progress')).toHaveText(`0 of ${total} stages done`);
	// The guide's photos come with their stage.
	const cabling = stages.filter({
		has: page.getByRole('heading', { name: /Power supply and cabling/ })
	});
	await expectLoaded(cabling.locator('img').first());
	await expect(cabling.getByText('Caution:').first()).toBeVisible();

	// Ticked from the keyboard, the stage's control keeps the focus while it saves and after.
	await cabling.getByRole('button', { name: 'Mark Power supply and cabling done' }).focus();
	await page.keyboard.press('Space');
	await expect(checklist.getByTestId('checklist-progress')).toHaveText(`1 of ${total} stages done`);
	await expect(cabling.getByRole('heading')).toContainText('(done)');
	await expect(
		cabling.getByRole('button', { name: 'Mark Power supply and cabling not done' })
	).toBeFocused();
	await expect(checklist.locator('[aria-live="polite"]')).toHaveText(
		'Power supply and cabling: done.'
	);
	await page.keyboard.press('Enter');
	await expect(checklist.getByTestId('checklist-progress')).toHaveText(`0 of ${total} stages done`);
	await expect(
		cabling.getByRole('button', { name: 'Mark Power supply and cabling done' })
	).toBeFocused();
	await page.keyboard.press('Space');
	await expect(checklist.getByTestId('checklist-progress')).toHaveText(`1 of ${total} stages done`);
	await page.reload();
	await expect(checklist.getByTestId('checklist-progress')).toHaveText(`1 of ${total} stages done`);
	await expectNoSidewaysScroll(page);
	const violations = await severeViolations(page);
	expect(violations, violations.join('\n')).toEqual([]);

	// Photos of the finished build need a public build.
	await expect(page.getByRole('heading', { name: 'The finished build' })).toHaveCount(0);
	await page.getByLabel('Public, listed on the guide').check();
	await page.getByRole('button', { name: 'Save settings' }).click();
	const finished = page.locator('section', {
		has: page.getByRole('heading', { name: 'The finished build' })
	});
	await finished.getByLabel(/^Alt text/).fill('My finished build, side panel off');
	await finished.getByTestId('photo-input').setInputFiles({
		name: 'finished.jpg',
		mimeType: 'image/jpeg',
		buffer: await drawnJpeg('#26323f')
	});
	await expect(finished.getByTestId('upload-phase')).toHaveText('Done', { timeout: 60_000 });
	await expectLoaded(finished.getByRole('img', { name: 'My finished build, side panel off' }));

	// A visitor sees it on the public build, with a way to report it.
	const buildUrl = new URL(page.url()).pathname;
	const visitor = await (await browser.newContext()).newPage();
	await visitor.setViewportSize({ width: 390, height: 900 });
	await visitor.goto(buildUrl);
	await expectLoaded(visitor.getByRole('img', { name: 'My finished build, side panel off' }));
	await expect(visitor.getByTestId('checklist-progress')).toHaveText(`1 of ${total} stages done`);
	await expect(visitor.getByRole('button', { name: /Mark .* done/ })).toHaveCount(0);
	await expectNoSidewaysScroll(visitor);
	for (const p of [page, visitor]) await p.context().close();
});
