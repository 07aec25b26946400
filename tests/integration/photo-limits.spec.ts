/*
 * The limits of a photo upload that are not about bytes, on the real MariaDB, the real
 * pipeline (sharp) and both photo stores: an image whose stored copies the encoders cannot
 * make (too tall for its width) is refused while the uploader waits, with the limit named and
 * nothing stored, while one just inside the limit is made in full; failed photos do not take
 * a place among a guide's 60; the 61st upload of an hour is refused by the real limiter
 * (rate_limits in MariaDB) before anything is read or stored.
 */
import sharp from 'sharp';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { uploadPhotoAs } from '../../src/lib/server/api/photos';
import { Guide, Photo, User, sequelize } from '../../src/lib/server/db';
import { PhotoWorker, photoJobSettingsFromEnv } from '../../src/lib/server/images/photo-jobs';
import { closeRateLimits, consume } from '../../src/lib/server/rate-limit';
import { useStorage } from '../../src/lib/server/storage';
import type { ObjectStorage } from '../../src/lib/server/storage';
import * as photos from '../../src/lib/server/services/photos';
import { plainPng } from '../support/images';
import { photoStoreDrivers, quietBoxGuide } from '../support/photo-stores';

let store: ObjectStorage;
let author: User;
const guide = { kind: 'guide', slug: 'quiet-box' } as const;
const actor = () => ({ id: author.id, role: 'author' });

beforeEach(async () => {
	({ author } = await quietBoxGuide(store));
});
afterAll(closeRateLimits);

/** A flat JPEG of the given size (20 megapixels at 1000 × 20000, under the 40 accepted). */
const flatJpeg = (width: number, height: number) =>
	sharp({ create: { width, height, channels: 3, background: '#44546a' } })
		.jpeg({ quality: 80 })
		.toBuffer();

/** Uploads to the guide and runs the background job to the end; the photo's status after it. */
async function uploadAndProcess(input: Buffer) {
	const accepted = await photos.upload(actor(), guide, input);
	if (accepted.kind !== 'accepted') throw new Error(accepted.kind);
	await new PhotoWorker(sequelize, () => store, photoJobSettingsFromEnv({})).drain();
	return photos.uploadStatus(actor(), guide, accepted.status.id);
}

/** A multipart upload request, as the browser sends one (the field `file`). */
async function uploadRequest(): Promise<Request> {
	const form = new FormData();
	form.set(
		'file',
		new Blob([new Uint8Array(await plainPng(640, 480))], { type: 'image/png' }),
		'desk.png'
	);
	return new Request('http://app.test/api/v1/guides/quiet-box/photos', {
		method: 'POST',
		body: form
	});
}

/** `count` photo rows of the guide in `state`, with no files (the limit counts rows). */
async function guidePhotoRows(count: number, state: 'ready' | 'processing' | 'failed') {
	const row = await Guide.findOne({ where: { slug: 'quiet-box' } });
	for (let i = 0; i < count; i++)
		await Photo.create({
			ownerId: author.id,
			guideId: row?.id ?? 0,
			keyPrefix: `photos/filler-${state}-${i}`,
			width: 800,
			height: 600,
			bytes: state === 'failed' ? 0 : 1000,
			placeholder: '',
			variants: [],
			state,
			failure: state === 'failed' ? 'The image could not be decoded.' : null
		});
}

for (const driver of photoStoreDrivers()) {
	describe(`with the ${driver.name} photo store`, () => {
		beforeAll(async () => {
			store = await driver.open();
			useStorage(store);
		});
		afterAll(async () => {
			useStorage(undefined);
			await driver.close();
		});

		describe('an image too tall for its width', () => {
			// WebP takes at most 16383 pixels on a side (AVIF 16384), measured with sharp 0.35.6.
			const cases: [string, () => Promise<Buffer>, RegExp][] = [
				[
					'a JPEG 1000 × 20000 (its 960 px copy would be 19200 tall)',
					() => flatJpeg(1000, 20000),
					/1000 × 20000 pixels.*960 pixels wide would be 19200 pixels tall.*at most 16383 pixels on a side.*at most 17066 pixels tall/
				],
				[
					'a PNG 300 × 17000 (kept at its own width, 17000 tall)',
					() => plainPng(300, 17000),
					/300 × 17000 pixels.*300 pixels wide would be 17000 pixels tall.*at most 16383 pixels on a side.*at most 16383 pixels tall/
				],
				[
					'a PNG 480 × 16384, one pixel over',
					() => plainPng(480, 16384),
					/at most 16383 pixels on a side/
				]
			];
			for (const [name, make, message] of cases) {
				it(`${name} is refused at upload with 422, the limit named and nothing stored`, async () => {
					const outcome = await photos.upload(actor(), guide, await make());
					expect(outcome.kind).toBe('rejected');
					if (outcome.kind !== 'rejected') return;
					expect(outcome.status).toBe(422);
					expect(outcome.message).toMatch(message);
					expect(await store.list('')).toEqual([]);
					expect(await Photo.count()).toBe(0);
				});
			}

			it('480 × 16383, at the limit, is accepted and every planned file is made', async () => {
				const status = await uploadAndProcess(await plainPng(480, 16383));
				expect(status?.state).toBe('ready');
				expect(status?.photo?.variants.map((v) => `${v.format} ${v.width}×${v.height}`)).toEqual([
					'avif 480×16383',
					'webp 480×16383',
					'jpeg 480×16383'
				]);
				expect(await store.list('photos/')).toHaveLength(3);
				expect(await store.list('originals/')).toEqual([]);
			});

			it('a strip 8 × 16000 is made in full, its placeholder inside 16 × 16', async () => {
				const status = await uploadAndProcess(await plainPng(8, 16000));
				expect(status?.state).toBe('ready');
				expect(status?.photo?.variants.map((v) => `${v.format} ${v.width}×${v.height}`)).toEqual([
					'avif 8×16000',
					'webp 8×16000',
					'jpeg 8×16000'
				]);
				const placeholder = Buffer.from(
					(status?.photo?.placeholder ?? '').replace(/^data:image\/webp;base64,/, ''),
					'base64'
				);
				const meta = await sharp(placeholder).metadata();
				// 8 × 16000 fitted inside 16 × 16: 16 tall, 8 × 16 / 16000 = 0.008 wide, so 1.
				expect([meta.width, meta.height]).toEqual([1, 16]);
			});
		});

		describe('photos per guide', () => {
			it('failed photos do not take a place among the 60: 59 ready and 1 failed still take one more', async () => {
				await guidePhotoRows(59, 'ready');
				await guidePhotoRows(1, 'failed');
				const outcome = await photos.upload(actor(), guide, await plainPng(640, 480));
				expect(outcome.kind).toBe('accepted');
			});

			it('photos still processing do: 59 ready and 1 processing refuse the next with the limit', async () => {
				await guidePhotoRows(59, 'ready');
				await guidePhotoRows(1, 'processing');
				const outcome = await photos.upload(actor(), guide, await plainPng(640, 480));
				expect(outcome).toEqual({
					kind: 'conflict',
					message: 'At most 60 photos here; delete one first.'
				});
				expect(await store.list('')).toEqual([]);
				expect(await Photo.count()).toBe(60);
			});
		});

		describe('uploads per hour', () => {
			it('the 61st upload in an hour is refused with 429 and Retry-After, and stores nothing', async () => {
				// 59 uploads already counted this hour, through the real limiter under the key the
				// upload route counts (the account), rather than 59 files sent.
				for (let i = 0; i < 59; i++)
					expect((await consume('photoUploadByUser', author.id)).ok).toBe(true);
				const user = {
					id: author.id,
					email: author.email,
					name: author.name,
					role: 'author' as const
				};
				const sixtieth = await uploadPhotoAs(user, await uploadRequest(), guide);
				expect(sixtieth.status).toBe(201);

				const sixtyFirst = await uploadPhotoAs(user, await uploadRequest(), guide);
				expect(sixtyFirst.status).toBe(429);
				const wait = Number(sixtyFirst.headers.get('retry-after'));
				// The hour's window started with the first of the 60, moments ago.
				expect(wait).toBeGreaterThan(3500);
				expect(wait).toBeLessThanOrEqual(3600);
				expect(await sixtyFirst.json()).toMatchObject({
					message: 'Too many photo uploads in the last hour. Please wait a little and try again.'
				});
				// Only the 60th is kept: its row and its original, waiting for the job.
				expect(await Photo.count()).toBe(1);
				expect(await store.list('originals/')).toHaveLength(1);
				expect(await store.list('photos/')).toEqual([]);
			});
		});
	});
}
