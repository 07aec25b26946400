/*
 * Photo uploads end to end below HTTP: the real pipeline (sharp), a real photo store and the
 * real MariaDB. Bad input stores nothing; a stored photo carries no EXIF or GPS; only the
 * guide's author uploads; the quota holds; delete removes every file, except while a live
 * revision shows the photo; /media serves what was stored with our headers. The whole file
 * runs twice: against the disk store (a temporary folder) and against the S3 store through
 * @aws-sdk/client-s3 and a local S3 fake (s3rver) on loopback.
 */
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
	GalleryPhoto,
	Guide,
	GuideRevision,
	Photo,
	User,
	sequelize
} from '../../src/lib/server/db';
import { PhotoWorker, photoJobSettingsFromEnv } from '../../src/lib/server/images/photo-jobs';
import { useStorage } from '../../src/lib/server/storage';
import type { ObjectStorage } from '../../src/lib/server/storage';
import { GET as mediaRoute } from '../../src/routes/media/[...key]/+server';
import * as photos from '../../src/lib/server/services/photos';
import { photoStoreDrivers, quietBoxGuide } from '../support/photo-stores';
import {
	bombPng,
	elfRenamedJpg,
	gifPolyglot,
	heicHeader,
	jpegWithGps,
	svgFile,
	textFile,
	truncatedJpeg
} from '../support/images';

let store: ObjectStorage;
let author: User;
let other: User;

const drivers = photoStoreDrivers();

beforeEach(async () => {
	({ author, other } = await quietBoxGuide(store));
});

const guide = { kind: 'guide', slug: 'quiet-box' } as const;

/** sharp's reading of a stored file; the AVIF loader is blocked for uploads, so it is let in for the check only. */
async function readBack(bytes: Buffer) {
	sharp.unblock({ operation: ['VipsForeignLoadHeifBuffer'] });
	try {
		return await sharp(bytes).metadata();
	} finally {
		sharp.block({ operation: ['VipsForeignLoadHeifBuffer'] });
	}
}
const actor = () => ({ id: author.id, role: 'author' });

/** A guide upload is accepted in `processing`; the background job (run here to the end) makes the files. */
async function uploadReady(input: Buffer) {
	const accepted = await photos.upload(actor(), guide, input);
	if (accepted.kind !== 'accepted') throw new Error(accepted.kind);
	expect(accepted.status.state).toBe('processing');
	await new PhotoWorker(sequelize, () => store, photoJobSettingsFromEnv({})).drain();
	const status = await photos.uploadStatus(actor(), guide, accepted.status.id);
	expect(status?.state).toBe('ready');
	if (!status?.photo) throw new Error('not ready');
	return { kind: 'ok' as const, photo: status.photo };
}

for (const driver of drivers) {
	describe(`with the ${driver.name} photo store`, () => {
		beforeAll(async () => {
			store = await driver.open();
			useStorage(store);
		});
		afterAll(async () => {
			useStorage(undefined);
			await driver.close();
		});

		describe('uploading a guide photo', () => {
			it('stores upright variants without EXIF or GPS, and the original size after orientation', async () => {
				const input = await jpegWithGps(1200, 800);
				// The input really carries the coordinates (51° 30′ N = 51.5, hand-worked in support/images.ts).
				expect((await exifr.gps(input))?.latitude).toBe(51.5);

				const outcome = await uploadReady(input);
				expect(outcome.kind).toBe('ok');
				if (outcome.kind !== 'ok') return;
				// Orientation 6 turns 1200 × 800 into 800 × 1200; 800 px wide → only the 480 width (no upscaling).
				expect([outcome.photo.width, outcome.photo.height]).toEqual([800, 1200]);
				expect(
					outcome.photo.variants.map((v) => `${v.format} ${v.width}×${v.height}`).sort()
				).toEqual(['avif 480×720', 'jpeg 480×720', 'webp 480×720']);
				expect(outcome.photo.placeholder).toMatch(/^data:image\/webp;base64,/);

				const keys = await store.list('photos/');
				expect(keys).toHaveLength(3);
				// The original (with its GPS) is gone once the variants exist.
				expect(await store.list('originals/')).toEqual([]);
				for (const key of keys) {
					const file = await store.get(key);
					const bytes = Buffer.from(file?.body ?? []);
					const meta = await readBack(bytes);
					expect(meta.exif, key).toBeUndefined();
					expect(meta.xmp, key).toBeUndefined();
					expect(meta.orientation ?? 1, key).toBe(1);
					expect(await exifr.gps(bytes).catch(() => undefined), key).toBeUndefined();
					expect([meta.width, meta.height], key).toEqual([480, 720]);
				}
				const row = await Photo.findOne();
				expect(row?.ownerId).toBe(author.id);
				expect(Number(row?.bytes)).toBe(
					(
						await Promise.all(keys.map(async (k) => (await store.get(k))?.body.byteLength ?? 0))
					).reduce((a, b) => a + b, 0)
				);
			});

			it('/media serves every stored variant with its type, nosniff and a year of caching', async () => {
				const outcome = await uploadReady(await jpegWithGps(1200, 800));
				type MediaEvent = Parameters<typeof mediaRoute>[0];
				const serve = (key: string) => mediaRoute({ params: { key } } as unknown as MediaEvent);
				const types = { avif: 'image/avif', webp: 'image/webp', jpeg: 'image/jpeg' };
				for (const variant of outcome.photo.variants) {
					const key = variant.url.replace(/^\/media\//, '');
					const answer = await serve(key);
					expect(answer.status, key).toBe(200);
					expect(answer.headers.get('content-type'), key).toBe(types[variant.format]);
					expect(answer.headers.get('x-content-type-options'), key).toBe('nosniff');
					expect(answer.headers.get('cache-control'), key).toBe(
						'public, max-age=31536000, immutable'
					);
					const served = Buffer.from(await answer.arrayBuffer());
					expect(served.equals(Buffer.from((await store.get(key))?.body ?? [])), key).toBe(true);
				}
				// A key no photo row owns is not served, even if a file sat there.
				await expect(serve('photos/nobody/480.webp')).rejects.toMatchObject({ status: 404 });
			});

			it('makes 480, 960 and 1600 from a large original, in AVIF and WebP, with one JPEG at 960', async () => {
				const input = await sharp({
					create: { width: 2400, height: 1600, channels: 3, background: '#5b6672' }
				})
					.jpeg()
					.toBuffer();
				const outcome = await uploadReady(input);
				expect(outcome.photo.variants.map((v) => `${v.format} ${v.width}`).sort()).toEqual([
					'avif 1600',
					'avif 480',
					'avif 960',
					'jpeg 960',
					'webp 1600',
					'webp 480',
					'webp 960'
				]);
				// 2400 × 1600 is 3:2: 960 wide → 640 high.
				expect(outcome.photo.variants.find((v) => v.format === 'jpeg')?.height).toBe(640);
			});

			it("is the guide author's alone: another author gets not found and nothing is stored", async () => {
				const outcome = await photos.upload(
					{ id: other.id, role: 'author' },
					guide,
					await jpegWithGps()
				);
				expect(outcome.kind).toBe('not_found');
				expect(await store.list('')).toEqual([]);
				expect(await Photo.count()).toBe(0);
			});

			it('refuses an upload once the quota is used up, and stores nothing', async () => {
				await Photo.create({
					ownerId: author.id,
					keyPrefix: 'photos/filler',
					width: 1,
					height: 1,
					bytes: photos.QUOTA_BYTES,
					placeholder: '',
					variants: []
				});
				const outcome = await photos.upload(actor(), guide, await jpegWithGps());
				expect(outcome.kind).toBe('quota');
				expect(await store.list('')).toEqual([]);
				expect(await Photo.count()).toBe(1);
			});
		});

		describe('bad input: a clear refusal and nothing stored', () => {
			const cases: [string, () => Buffer | Promise<Buffer>, number, RegExp][] = [
				[
					'a file over the size limit',
					() => Buffer.alloc(15 * 1024 * 1024 + 1, 0xff),
					413,
					/at most 15 MB/
				],
				['a text file', textFile, 415, /not a JPEG, PNG or WebP/],
				['an executable renamed .jpg', elfRenamedJpg, 415, /program/],
				['an SVG with a script', svgFile, 415, /SVG/],
				['a GIF/JavaScript polyglot', gifPolyglot, 415, /GIF/],
				['an HEIC photo (no HEVC decoder here)', heicHeader, 415, /HEIC/],
				['a truncated JPEG', truncatedJpeg, 422, /damaged|incomplete/],
				['a PNG claiming 14000 × 14000 pixels', () => bombPng(), 422, /196 megapixels/]
			];
			for (const [name, make, status, message] of cases) {
				it(`${name} → ${status}`, async () => {
					const outcome = await photos.upload(actor(), guide, await make());
					expect(outcome.kind).toBe('rejected');
					if (outcome.kind === 'rejected') {
						expect(outcome.status).toBe(status);
						expect(outcome.message).toMatch(message);
					}
					// Nothing anywhere in the store: no variants and no original.
					expect(await store.list('')).toEqual([]);
					expect(await Photo.count()).toBe(0);
				});
			}

			it('refuses the decompression bomb from its header, without decoding it', async () => {
				const bomb = bombPng();
				// A few hundred kilobytes on the wire for 196 million pixels.
				expect(bomb.byteLength).toBeLessThan(700 * 1024);
				const before = process.memoryUsage().rss;
				const outcome = await photos.upload(actor(), guide, bomb);
				const grown = process.memoryUsage().rss - before;
				expect(outcome.kind).toBe('rejected');
				// Decoding would need at least 196 MB (greyscale) to 588 MB (RGB); refusing from the header needs next to nothing.
				expect(grown).toBeLessThan(64 * 1024 * 1024);
			});
		});

		describe('deleting a guide photo', () => {
			it('removes the row and every stored variant', async () => {
				const outcome = await uploadReady(await jpegWithGps(2000, 1000));
				expect((await store.list('photos/')).length).toBeGreaterThan(0);
				expect(await photos.remove(actor(), guide, outcome.photo.id)).toEqual({ kind: 'ok' });
				expect(await store.list('photos/')).toEqual([]);
				expect(await Photo.count()).toBe(0);
			});

			it('is refused while the live revision shows the photo, and keeps its files', async () => {
				const outcome = await uploadReady(await jpegWithGps());
				const row = await Guide.findOne({ where: { slug: 'quiet-box' } });
				const revision = await GuideRevision.findOne({ where: { guideId: row?.id } });
				await GalleryPhoto.create({
					revisionId: revision?.id ?? 0,
					photoId: outcome.photo.id,
					stage: 'cooler',
					position: 1,
					caption: '',
					altText: 'The cooler'
				});
				await row?.update({ publishedRevisionId: revision?.id ?? null, state: 'published' });
				const refused = await photos.remove(actor(), guide, outcome.photo.id);
				expect(refused.kind).toBe('conflict');
				expect((await store.list('photos/')).length).toBe(3);
				expect(await Photo.count()).toBe(1);
			});

			it("answers not found for another author's photo", async () => {
				const outcome = await uploadReady(await jpegWithGps());
				expect(
					await photos.remove({ id: other.id, role: 'author' }, guide, outcome.photo.id)
				).toEqual({
					kind: 'not_found'
				});
				expect(await Photo.count()).toBe(1);
			});
		});
	});
}
