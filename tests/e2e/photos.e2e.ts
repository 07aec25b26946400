import { expect, test } from '@playwright/test';
import type { APIRequestContext } from '@playwright/test';
import exifr from 'exifr';
import sharp from 'sharp';
import { BASE_URL } from '../playwright.config';
import { bombPng, jpegWithGps, svgFile } from '../support/images';
import { AUTHOR, draftGuide, signedIn } from './photo-support';
import { forgetCounts, severeViolations } from './support';

/*
 * Photos in Chromium against the production build: an author uploads three photos with
 * visible progress (they join the gallery in the order picked), files them under assembly
 * stages (the editor groups them as the guide page will), reorders within a stage by
 * keyboard, writes alt text and submits; an editor sees the new photos on the review page and approves; a visitor sees
 * the gallery and walks the lightbox by keyboard. Over HTTP: served files carry no EXIF or
 * GPS and the right headers, and bad files get 413, 415 and 422 with nothing stored.
 */

const EDITOR = 'editor@slotwise.test';

const WIDTHS = [2000, 1800, 1600];

/** Three distinct drawn photos (flat colours with a block; nothing is a photograph). */
async function threePhotos() {
	const colours = ['#2f4858', '#b4532a', '#0e6f6a'];
	return Promise.all(
		colours.map(async (background, i) => ({
			name: `stage-${i + 1}.jpg`,
			mimeType: 'image/jpeg',
			buffer: await sharp({
				create: { width: WIDTHS[i] ?? 2000, height: 1200, channels: 3, background }
			})
				.composite([
					{
						input: { create: { width: 600, height: 400, channels: 3, background: '#fbf8f3' } },
						left: 200 + i * 300,
						top: 300
					}
				])
				.jpeg({ quality: 90 })
				.toBuffer()
		}))
	);
}

test('upload three photos, file and order them, submit, approve: the guide page shows them and the lightbox works', async ({
	browser
}) => {
	test.setTimeout(180_000); // three photos through sharp and two sign-ins on a shared machine
	await forgetCounts('photo_user');
	const title = `Gallery run ${Date.now()}`;
	const author = await signedIn(browser, AUTHOR);
	const slug = await draftGuide(author.request, title);
	await author.goto(`/my/guides/${slug}/edit`);

	// The first picked file reaches the server last, so it is processed and finishes last.
	await author.route(`**/api/v1/guides/${slug}/photos`, async (route) => {
		const request = route.request();
		if (request.method() === 'POST' && request.postDataBuffer()?.includes('stage-1.jpg'))
			await new Promise((resolve) => setTimeout(resolve, 4000));
		await route.continue();
	});
	await author.getByTestId('photo-input').setInputFiles(await threePhotos());
	// Each file gets its own row with a progress bar while it uploads, then one fed by the
	// photo's status while the server makes its sizes in the background (one photo at a time).
	await expect(author.getByTestId('upload')).toHaveCount(3);
	await expect(author.locator('[data-testid=upload] progress').first()).toBeVisible();
	await expect(author.getByTestId('processing-progress').first()).toBeVisible({
		timeout: 60_000
	});
	await expect(author.getByTestId('upload-phase').filter({ hasText: 'Done' })).toHaveCount(3, {
		timeout: 120_000
	});
	const items = author.getByTestId('gallery-item');
	const widths = () =>
		items.locator('img').evaluateAll((els) => els.map((e) => e.getAttribute('width')));
	/** A photo's row in the editor, by the width of its photo. */
	const row = (width: number) => items.filter({ has: author.locator(`img[width="${width}"]`) });
	// In the order they were picked, not the order they finished; no stage yet.
	await expect.poll(widths).toEqual(WIDTHS.map(String));
	await expect(author.getByTestId('gallery-group')).toHaveText(['Not filed under a stage yet']);

	for (const [i, width] of WIDTHS.entries()) {
		await row(width)
			.getByLabel('Alt text (required)')
			.fill(`Photo number ${i + 1} of the build`);
		await row(width)
			.getByLabel('Caption')
			.fill(`Caption ${i + 1}`);
	}
	// Filing a photo under a stage moves it to that stage's group, the focus with it.
	const stages: [number, string][] = [
		[2000, 'Power supply and cabling'],
		[1800, 'CPU cooler'],
		[1600, 'CPU cooler']
	];
	for (const [width, stage] of stages) {
		const select = row(width).getByLabel('Assembly stage');
		await select.focus();
		await select.selectOption({ label: stage });
		await expect(row(width).getByLabel('Assembly stage')).toBeFocused();
	}
	// Grouped as the guide page will show them: stages in assembly order.
	await expect(author.getByTestId('gallery-group')).toHaveText([
		'CPU cooler',
		'Power supply and cabling'
	]);
	await expect.poll(widths).toEqual(['1800', '1600', '2000']);

	// Keyboard: the third photo's "earlier" button, by Tab focus and Enter, moves it before
	// the other cooler photo, and the focus stays on it.
	await row(1600).getByRole('button', { name: 'Move CPU cooler photo 2 earlier' }).focus();
	await author.keyboard.press('Enter');
	await expect.poll(widths).toEqual(['1600', '1800', '2000']);
	await expect(
		row(1600).getByRole('button', { name: 'Move CPU cooler photo 1 earlier' })
	).toBeFocused();
	// Alt+↓ from a field moves it later within its stage, never into another stage's photos.
	await row(1600).getByLabel('Caption').focus();
	await author.keyboard.press('Alt+ArrowDown');
	await expect.poll(widths).toEqual(['1800', '1600', '2000']);
	await expect(row(1600).getByLabel('Caption')).toBeFocused();
	await author.keyboard.press('Alt+ArrowDown');
	await expect.poll(widths).toEqual(['1800', '1600', '2000']);
	await author.keyboard.press('Alt+ArrowUp');
	await expect.poll(widths).toEqual(['1600', '1800', '2000']);
	const editorOrder = await items
		.getByLabel('Alt text (required)')
		.evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value));
	expect(editorOrder).toEqual([
		'Photo number 3 of the build',
		'Photo number 2 of the build',
		'Photo number 1 of the build'
	]);
	const editorViolations = await severeViolations(author);
	expect(editorViolations, editorViolations.join('\n')).toEqual([]);
	// At a phone width (390 px) the gallery editor still fits: no sideways scrolling, and
	// each photo's fields and buttons are on screen.
	await author.setViewportSize({ width: 390, height: 900 });
	const [scroll, inner] = await author.evaluate(() => [
		document.documentElement.scrollWidth,
		window.innerWidth
	]);
	expect(scroll, `editor ${scroll} px wide in a ${inner} px window`).toBeLessThanOrEqual(inner);
	const earlier = row(2000).getByRole('button', {
		name: 'Move Power supply and cabling photo 1 earlier'
	});
	await earlier.scrollIntoViewIfNeeded();
	const button = await earlier.boundingBox();
	expect((button?.x ?? -1) >= 0 && (button?.x ?? 0) + (button?.width ?? 0) <= 390).toBe(true);
	await author.setViewportSize({ width: 1280, height: 900 });

	await author.getByRole('button', { name: 'Save and submit for review' }).click();
	// The draft's fit report has a conflict (no display output): the editor asks first.
	await author.getByRole('button', { name: 'Submit with the conflicts' }).click();
	await expect(author).toHaveURL(/\/my\/guides\?submitted=/);

	const editor = await signedIn(browser, EDITOR);
	await editor.goto('/review');
	await editor.getByTestId('review-queue').getByRole('link', { name: title }).click();
	const changes = editor.getByTestId('photo-changes');
	await expect(changes.getByRole('heading', { name: 'New photos (3)' })).toBeVisible();
	const reviewViolations = await severeViolations(editor);
	expect(reviewViolations, reviewViolations.join('\n')).toEqual([]);
	await editor.getByRole('button', { name: 'Publish', exact: true }).click();
	await editor.getByRole('button', { name: 'Yes, publish now' }).click();
	await expect(editor.getByText('Published: this revision is now live.')).toBeVisible();

	const visitor = await (await browser.newContext()).newPage();
	await visitor.goto(`/guides/${slug}`);
	const gallery = visitor.getByRole('region', { name: 'Assembly photos' });
	await expect(gallery.getByTestId('gallery-stage')).toHaveCount(2);
	// Stages in assembly order, and the photos in the order the editor showed them.
	await expect(gallery.getByRole('heading', { level: 3 })).toHaveText([
		'CPU cooler',
		'Power supply and cabling'
	]);
	expect(
		await gallery.locator('img').evaluateAll((els) => els.map((e) => e.getAttribute('alt')))
	).toEqual(editorOrder);
	await expect(gallery.getByText('Never open a power supply', { exact: false })).toBeVisible();
	const first = gallery.locator('picture').first();
	await expect(first.locator('source[type="image/avif"]')).toHaveAttribute(
		'srcset',
		/480w.*960w.*1600w/
	);
	await expect(first.locator('source[type="image/webp"]')).toHaveAttribute('sizes', /.+/);
	await expect(first.locator('img')).toHaveAttribute('loading', 'lazy');
	await expect(first.locator('img')).toHaveAttribute('alt', 'Photo number 3 of the build');
	const pageViolations = await severeViolations(visitor);
	expect(pageViolations, pageViolations.join('\n')).toEqual([]);

	const opener = gallery.getByRole('link', { name: 'Enlarge: Photo number 3 of the build' });
	await opener.click();
	const dialog = visitor.getByRole('dialog', { name: 'Assembly photos' });
	await expect(dialog).toBeVisible();
	await expect(dialog.getByTestId('lightbox-caption')).toContainText('Caption 3');
	await expect(dialog.getByTestId('lightbox-caption')).toContainText('Photo 1 of 3');
	await visitor.keyboard.press('ArrowRight');
	await expect(dialog.getByTestId('lightbox-caption')).toContainText('Photo 2 of 3');
	await visitor.keyboard.press('ArrowLeft');
	await visitor.keyboard.press('ArrowLeft');
	await expect(dialog.getByTestId('lightbox-caption')).toContainText('Photo 3 of 3');
	const lightboxViolations = await severeViolations(visitor);
	expect(lightboxViolations, lightboxViolations.join('\n')).toEqual([]);
	await visitor.keyboard.press('Escape');
	await expect(dialog).toBeHidden();
	await expect(opener).toBeFocused();
	for (const page of [author, editor, visitor]) await page.context().close();
});

test('a JPEG with EXIF GPS: no served variant carries EXIF or GPS, and files come with nosniff and long caching', async ({
	browser
}) => {
	test.setTimeout(90_000);
	await forgetCounts('photo_user');
	const author = await signedIn(browser, AUTHOR);
	const slug = await draftGuide(author.request, `GPS run ${Date.now()}`);
	const input = await jpegWithGps(2000, 1200);
	expect((await exifr.gps(input))?.latitude).toBe(51.5);
	const response = await author.request.post(`/api/v1/guides/${slug}/photos`, {
		multipart: { file: { name: 'with-gps.jpg', mimeType: 'image/jpeg', buffer: input } },
		headers: { origin: BASE_URL }
	});
	expect(response.status()).toBe(201);
	type Status = {
		state: string;
		statusUrl: string;
		progress: { done: number; total: number };
		variants: { url: string; format: string }[];
	};
	// Accepted at once; the sizes are made in the background.
	const photo = (await response.json()) as Status;
	expect(photo.state).toBe('processing');
	expect(response.headers()['location']).toBe(photo.statusUrl);
	// EXIF orientation 6 turns 2000 × 1200 into 1200 × 2000: 480 and 960 in AVIF and WebP,
	// one JPEG at 960 = 5 files (the width rule of domain/photo-variants.ts, counted by hand).
	expect(photo.progress).toEqual({ done: 0, total: 5 });
	expect(photo.variants).toHaveLength(5);
	let status = photo;
	await expect
		.poll(
			async () => {
				status = (await (await author.request.get(photo.statusUrl)).json()) as Status;
				return status.state;
			},
			{ timeout: 60_000 }
		)
		.toBe('ready');
	expect(status.progress).toEqual({ done: 5, total: 5 });
	for (const variant of photo.variants) {
		const file = await author.request.get(variant.url);
		expect(file.status()).toBe(200);
		const headers = file.headers();
		expect(headers['content-type']).toBe(
			{ avif: 'image/avif', webp: 'image/webp', jpeg: 'image/jpeg' }[variant.format]
		);
		expect(headers['x-content-type-options']).toBe('nosniff');
		expect(headers['cache-control']).toBe('public, max-age=31536000, immutable');
		const bytes = await file.body();
		const meta = await sharp(bytes).metadata();
		expect(meta.exif, variant.url).toBeUndefined();
		expect(await exifr.gps(bytes).catch(() => undefined), variant.url).toBeUndefined();
	}
	await author.context().close();
});

test('bad files: 413 with the limit, 415 for SVG and non-multipart, 422 for a bomb, 401 and 404 for others', async ({
	browser
}) => {
	test.setTimeout(90_000);
	await forgetCounts('photo_user');
	const author = await signedIn(browser, AUTHOR);
	const slug = await draftGuide(author.request, `Bad files ${Date.now()}`);
	const post = (request: APIRequestContext, buffer: Buffer, name = 'photo.jpg') =>
		request.post(`/api/v1/guides/${slug}/photos`, {
			multipart: { file: { name, mimeType: 'image/jpeg', buffer } },
			headers: { origin: BASE_URL },
			failOnStatusCode: false
		});

	const tooBig = await post(author.request, Buffer.alloc(16 * 1024 * 1024, 0xff));
	expect(tooBig.status()).toBe(413);
	expect((await tooBig.json()).message).toBe('Photos may be at most 15 MB.');
	const svg = await post(author.request, svgFile(), 'drawing.jpg');
	expect(svg.status()).toBe(415);
	expect((await svg.json()).message).toMatch(/SVG/);
	const bomb = await post(author.request, bombPng());
	expect(bomb.status()).toBe(422);
	expect((await bomb.json()).message).toMatch(/14000 × 14000 pixels/);
	const form = await author.request.post(`/api/v1/guides/${slug}/photos`, {
		form: { file: 'not a file' },
		headers: { origin: BASE_URL },
		failOnStatusCode: false
	});
	expect(form.status()).toBe(415);
	// Every other route keeps the 512 KB cap even though the server takes 16 MB bodies.
	const bigJson = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { padding: 'x'.repeat(600 * 1024) },
		failOnStatusCode: false
	});
	expect(bigJson.status()).toBe(413);

	const visitor = await (await browser.newContext()).newPage();
	expect((await post(visitor.request, await jpegWithGps())).status()).toBe(401);
	const reader = await signedIn(browser, 'reader@slotwise.test');
	expect((await post(reader.request, await jpegWithGps())).status()).toBe(404);

	// Nothing was stored for any of them: the editor lists no photo for this guide.
	await author.goto(`/my/guides/${slug}/edit`);
	await expect(author.getByText('No photos in this revision yet.')).toBeVisible();
	await expect(author.getByRole('heading', { name: 'Uploaded, not in this revision' })).toHaveCount(
		0
	);
	for (const page of [author, visitor, reader]) await page.context().close();
});
