import { readdir, rm } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import sharp from 'sharp';
import { BASE_URL } from '../playwright.config';
import { AUTHOR, draftGuide, signedIn } from './photo-support';
import { announcements, forgetCounts, recordAnnouncements } from './support';

/*
 * Photo processing seen from the guide editor: the phases an upload goes through (uploading,
 * processing n of m sizes, done, failed, cancelled), said to screen readers too; cancel while
 * the server processes, retry, and a failure the upload request could not have seen.
 */

/** A large drawn noise image (20 megapixels): its sizes take the server a few seconds. */
function slowPhoto() {
	return sharp({
		create: {
			width: 5000,
			height: 4000,
			channels: 3,
			background: '#6b7a86',
			noise: { type: 'gaussian', mean: 120, sigma: 30 }
		}
	})
		.jpeg({ quality: 80 })
		.toBuffer();
}

test('cancel while the server processes removes the photo; retry uploads it again and it ends ready', async ({
	browser
}) => {
	test.setTimeout(180_000);
	await forgetCounts('photo_user');
	const author = await signedIn(browser, AUTHOR);
	const slug = await draftGuide(author.request, `Cancel run ${Date.now()}`);
	await author.goto(`/my/guides/${slug}/edit`);
	await recordAnnouncements(author.getByTestId('upload-announcer'));
	const posted = author.waitForResponse(
		(r) => r.url().endsWith(`/api/v1/guides/${slug}/photos`) && r.request().method() === 'POST'
	);
	await author
		.getByTestId('photo-input')
		.setInputFiles({ name: 'busy.jpg', mimeType: 'image/jpeg', buffer: await slowPhoto() });
	const accepted = (await (await posted).json()) as { id: number; statusUrl: string };
	const row = author.getByTestId('upload');
	await expect(row.getByTestId('processing-progress')).toBeVisible();
	await expect(row.getByTestId('upload-phase')).toHaveText('Processing');
	// 5000 px wide: 480, 960 and 1600 in AVIF and WebP plus one JPEG = 7 sizes (counted by hand).
	await expect(row.getByTestId('processing-count')).toHaveText(/· [0-6] of 7 sizes/);
	await row.getByRole('button', { name: 'Cancel' }).click();
	await expect(row.getByTestId('upload-phase')).toHaveText('Cancelled');
	// Screen readers heard each phase, the sizes made so far among them.
	expect((await announcements(author)).join(' | ')).toMatch(
		/busy\.jpg: uploading.*busy\.jpg: processing, [0-6] of 7 sizes.*busy\.jpg: cancelled/
	);
	// The photo is gone from the server: its status answers 404 and the editor lists nothing.
	await expect
		.poll(
			async () =>
				(await author.request.get(accepted.statusUrl, { failOnStatusCode: false })).status(),
			{ timeout: 10_000 }
		)
		.toBe(404);
	await expect(author.getByTestId('gallery-item')).toHaveCount(0);

	await row.getByRole('button', { name: 'Retry' }).click();
	await expect(row.getByTestId('upload-phase')).toHaveText('Done', { timeout: 120_000 });
	await expect(author.getByTestId('gallery-item')).toHaveCount(1);
	await author.reload();
	// After a reload (the draft was not saved) the server holds only the photo from the retry:
	// one unplaced photo, the cancelled one gone.
	await expect(author.getByRole('button', { name: 'Add to gallery' })).toHaveCount(1);
	await author.context().close();
});

/** Where the app under test keeps originals waiting for processing (the disk store, per database). */
const ORIGINALS = resolve(
	import.meta.dirname,
	'../../.data/uploads',
	process.env.DB_NAME ?? 'slotwise_e2e',
	'originals'
);

async function originals(): Promise<string[]> {
	return readdir(ORIGINALS).catch(() => []);
}

test('processing that fails shows the reason and a retry, and the retry ends ready', async ({
	browser
}) => {
	test.setTimeout(180_000);
	await forgetCounts('photo_user');
	const author = await signedIn(browser, AUTHOR);
	const slug = await draftGuide(author.request, `Failing run ${Date.now()}`);
	await author.goto(`/my/guides/${slug}/edit`);
	const big = await slowPhoto();
	// Six large photos sent over the API keep the one worker of this app process busy for
	// several seconds (one photo at a time, oldest first)...
	const busyStatus: string[] = [];
	for (let i = 0; i < 6; i++) {
		const busy = await author.request.post(`/api/v1/guides/${slug}/photos`, {
			multipart: { file: { name: `busy-${i}.jpg`, mimeType: 'image/jpeg', buffer: big } },
			headers: { origin: BASE_URL }
		});
		expect(busy.status()).toBe(201);
		busyStatus.push(((await busy.json()) as { statusUrl: string }).statusUrl);
	}
	await recordAnnouncements(author.getByTestId('upload-announcer'));
	const before = new Set(await originals());
	const posted = author.waitForResponse(
		(r) => r.url().endsWith(`/api/v1/guides/${slug}/photos`) && r.request().method() === 'POST'
	);
	await author
		.getByTestId('photo-input')
		.setInputFiles({ name: 'lost.jpg', mimeType: 'image/jpeg', buffer: big });
	const accepted = (await (await posted).json()) as { statusUrl: string };
	// ...while this one waits its turn, the store loses its original (the one file that
	// appeared with this upload): a real failure the request could not have seen.
	const added = (await originals()).filter((name) => !before.has(name));
	expect(added).toHaveLength(1);
	// The worker has not started the last busy photo, so it cannot have read this one yet.
	const last = (await (await author.request.get(busyStatus.at(-1) ?? '')).json()) as {
		state: string;
		progress: { done: number };
	};
	expect([last.state, last.progress.done]).toEqual(['processing', 0]);
	await rm(join(ORIGINALS, added[0] ?? ''));
	const lost = author.getByTestId('upload');
	await expect(lost.getByTestId('upload-phase')).toHaveText('Failed', { timeout: 90_000 });
	await expect(lost.getByRole('alert')).toHaveText(
		'The uploaded file is no longer there. Upload it again.'
	);
	expect((await announcements(author)).at(-1)).toBe('lost.jpg: failed');

	await lost.getByRole('button', { name: 'Retry' }).click();
	await expect(lost.getByTestId('upload-phase')).toHaveText('Done', { timeout: 120_000 });
	await expect(author.getByTestId('gallery-item')).toHaveCount(1);
	// The retry removed the failed photo on the server.
	expect((await author.request.get(accepted.statusUrl, { failOnStatusCode: false })).status()).toBe(
		404
	);
	await author.context().close();
});
