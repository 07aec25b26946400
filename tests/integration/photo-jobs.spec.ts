/*
 * Photo processing off the request path (images/photo-jobs.ts) on the real MariaDB, the real
 * pipeline (sharp) and both photo stores (disk and S3 through s3rver): an accepted upload
 * waits in `processing` with only its original stored and shows nowhere; the job records
 * progress file by file and ends `ready` with the URLs promised at upload; a claim whose
 * lease ran out (a worker that died) is taken again, a live one is not; failure and cancel
 * leave no file behind, and a photo the encoders cannot take fails at once with the reason.
 */
import sharp from 'sharp';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { Guide, Part, Photo, User, sequelize } from '../../src/lib/server/db';
import {
	GAVE_UP_MESSAGE,
	PhotoWorker,
	photoJobSettingsFromEnv
} from '../../src/lib/server/images/photo-jobs';
import { useStorage } from '../../src/lib/server/storage';
import type { ObjectStorage } from '../../src/lib/server/storage';
import * as gallery from '../../src/lib/server/services/gallery';
import * as photos from '../../src/lib/server/services/photos';
import { plainPng } from '../support/images';
import { photoStoreDrivers, quietBoxGuide } from '../support/photo-stores';

let store: ObjectStorage;
let author: User;
let other: User;
const guide = { kind: 'guide', slug: 'quiet-box' } as const;
const actor = () => ({ id: author.id, role: 'author' });
const settings = photoJobSettingsFromEnv({});
const worker = () => new PhotoWorker(sequelize, () => store, settings);

/** 2400 × 1600: widths 480, 960 and 1600 in AVIF and WebP plus one JPEG = 7 files (domain/photo-variants.ts rule, worked by hand). */
const large = () =>
	sharp({
		create: {
			width: 2400,
			height: 1600,
			channels: 3,
			background: '#5b6672',
			noise: { type: 'gaussian', mean: 110, sigma: 25 }
		}
	})
		.jpeg({ quality: 85 })
		.toBuffer();

async function accept() {
	const outcome = await photos.upload(actor(), guide, await large());
	if (outcome.kind !== 'accepted') throw new Error(outcome.kind);
	return outcome.status;
}

/** Rewinds a photo's lease as a worker that died mid-job would have left it. */
async function leaseEnds(id: number, inSeconds: number, attempts = 1) {
	await sequelize.query(
		`UPDATE photos SET attempt_id = 'a-worker-that-died', attempts = :attempts,
		 lease_until = UTC_TIMESTAMP(3) + INTERVAL :s SECOND WHERE id = :id`,
		{ type: QueryTypes.UPDATE, replacements: { id, s: inSeconds, attempts } }
	);
}

/** A fan part and an editor who may give it photos. */
async function fanAndEditor() {
	await Part.create({
		category: 'fan',
		brand: 'Draftwell',
		model: 'Breeze 120',
		slug: 'draftwell-breeze-120',
		specs: { sizeMm: 120, count: 1, maxRpm: 1500 }
	});
	return User.create({ email: 'eve@example.test', name: 'Eve Editor', role: 'editor' });
}

/** Runs `work` while reading the row's progress every few milliseconds. */
async function watchProgress(id: number, work: Promise<unknown>): Promise<number[]> {
	const seen: number[] = [];
	let finished = false;
	void work.finally(() => (finished = true));
	while (!finished) {
		const row = await Photo.findByPk(id, { attributes: ['variantsDone'] });
		if (row && seen.at(-1) !== row.variantsDone) seen.push(row.variantsDone);
		await new Promise((r) => setTimeout(r, 5));
	}
	await work;
	return seen;
}

beforeEach(async () => {
	({ author, other } = await quietBoxGuide(store));
});

for (const driver of photoStoreDrivers()) {
	describe(`photo processing with the ${driver.name} photo store`, () => {
		beforeAll(async () => {
			store = await driver.open();
			useStorage(store);
		});
		afterAll(async () => {
			useStorage(undefined);
			await driver.close();
		});

		it('accepts an upload as processing, 0 of 7, with only the original stored and the photo shown nowhere', async () => {
			const status = await accept();
			expect(status.state).toBe('processing');
			expect(status.progress).toEqual({ done: 0, total: 7 });
			expect(status.statusUrl).toBe(`/api/v1/guides/quiet-box/photos/${status.id}`);
			expect(status.photo).toBeNull();
			expect(status.variants.map((v) => `${v.format} ${v.width}`)).toEqual([
				'avif 480',
				'webp 480',
				'avif 960',
				'webp 960',
				'jpeg 960',
				'avif 1600',
				'webp 1600'
			]);
			expect(await store.list('photos/')).toEqual([]);
			expect(await store.list('originals/')).toHaveLength(1);
			const row = await Photo.findByPk(status.id);
			expect(await photos.servable(row?.keyPrefix ?? '')).toBe(false);
			// Not in the editor's photo list, and a draft cannot place it in the gallery yet.
			expect(await gallery.guidePhotos(author.id, 'quiet-box')).toEqual({});
			const guideRow = await Guide.findOne({ where: { slug: 'quiet-box' } });
			const issues = await gallery.checkGallery(guideRow?.id ?? 0, [
				{ photoId: status.id, stage: 'cooler', caption: '', altText: 'The cooler' }
			]);
			expect(issues['gallery.0.photoId']?.[0]).toMatch(/still being processed/);
		});

		it('records progress file by file and ends ready with the URLs promised at upload', async () => {
			const status = await accept();
			const seen = await watchProgress(status.id, worker().runOnce());
			// Never backwards, more than the ends, and all 7 at the end.
			expect(seen).toEqual([...seen].sort((a, b) => a - b));
			expect(seen.length).toBeGreaterThanOrEqual(3);
			expect(seen.at(-1)).toBe(7);
			const done = await photos.uploadStatus(actor(), guide, status.id);
			expect(done?.state).toBe('ready');
			expect(done?.progress).toEqual({ done: 7, total: 7 });
			expect(done?.photo?.variants.map((v) => v.url).sort()).toEqual(
				status.variants.map((v) => v.url).sort()
			);
			expect(await store.list('photos/')).toHaveLength(7);
			// The original is deleted once the variants exist.
			expect(await store.list('originals/')).toEqual([]);
			const row = await Photo.findByPk(status.id);
			expect(row?.originalKey).toBeNull();
			expect(await photos.servable(row?.keyPrefix ?? '')).toBe(true);
		});

		it('is reported to the guide author only', async () => {
			const status = await accept();
			expect(await photos.uploadStatus({ id: other.id, role: 'author' }, guide, status.id)).toBe(
				null
			);
		});

		it('leaves a claim alone while its lease runs, and takes it again once the lease has run out', async () => {
			const status = await accept();
			const row = await Photo.findByPk(status.id);
			const keyPrefix = row?.keyPrefix ?? '';
			// The dead worker had written half a file before it stopped.
			await store.put(`${keyPrefix}/480.avif`, Buffer.from('half a fi'), 'image/avif');
			await leaseEnds(status.id, 3600);
			expect(await worker().runOnce()).toBe(false);
			expect((await Photo.findByPk(status.id))?.state).toBe('processing');

			await leaseEnds(status.id, -1);
			expect(await worker().runOnce()).toBe(true);
			const after = await Photo.findByPk(status.id);
			expect(after?.state).toBe('ready');
			expect(after?.attempts).toBe(2);
			// The half file was replaced by a whole one.
			const avif = await store.get(`${keyPrefix}/480.avif`);
			expect(avif?.body.byteLength).toBeGreaterThan(100);

			// The dead worker's late writes, under its old attempt id, change nothing.
			const late = await worker().process({
				id: status.id,
				keyPrefix,
				originalKey: row?.originalKey ?? null,
				attempts: 1,
				attemptId: 'a-worker-that-died'
			});
			expect(late).toBe('lost');
			expect((await Photo.findByPk(status.id))?.state).toBe('ready');
			expect(await store.list('photos/')).toHaveLength(7);
		});

		it(`gives up after ${settings.maxAttempts} claims: failed with a message, and no file left`, async () => {
			const status = await accept();
			const row = await Photo.findByPk(status.id);
			await store.put(`${row?.keyPrefix}/480.avif`, Buffer.from('half'), 'image/avif');
			await leaseEnds(status.id, -1, settings.maxAttempts);
			expect(await worker().runOnce()).toBe(true);
			const failed = await photos.uploadStatus(actor(), guide, status.id);
			expect(failed?.state).toBe('failed');
			expect(failed?.message).toBe(GAVE_UP_MESSAGE);
			expect(failed?.variants).toEqual([]);
			expect(await store.list('')).toEqual([]);
			expect(Number((await Photo.findByPk(status.id))?.bytes)).toBe(0);
		});

		it('fails with a message when the original is gone, and removes what was made', async () => {
			const status = await accept();
			const row = await Photo.findByPk(status.id);
			await store.delete([row?.originalKey ?? '']);
			await store.put(`${row?.keyPrefix}/480.webp`, Buffer.from('half'), 'image/webp');
			expect(await worker().runOnce()).toBe(true);
			const failed = await photos.uploadStatus(actor(), guide, status.id);
			expect(failed?.state).toBe('failed');
			expect(failed?.message).toMatch(/no longer there/);
			expect(await store.list('')).toEqual([]);
		});

		it('a part photo is processed while the editor waits, through the same job, and answers ready', async () => {
			const editor = await fanAndEditor();
			const outcome = await photos.upload(
				{ id: editor.id, role: 'editor' },
				{ kind: 'part', slug: 'draftwell-breeze-120' },
				await large(),
				{ caption: '', altText: 'The fan from the front' }
			);
			if (outcome.kind !== 'ok') throw new Error(outcome.kind);
			expect(outcome.photo.variants).toHaveLength(7);
			const row = await Photo.findByPk(outcome.photo.id);
			expect(row?.state).toBe('ready');
			expect(row?.attempts).toBe(1);
			expect(await store.list('originals/')).toEqual([]);
			// Nothing left for the background worker.
			expect(await worker().runOnce()).toBe(false);
		});

		it('a waiting photo the encoders cannot take fails on its first claim, with the limit named', async () => {
			// As a photo accepted before the upload checked its shape waits: 300 × 17000 is kept at
			// its own width, and WebP takes at most 16383 pixels on a side.
			const original = 'originals/accepted-before-the-check';
			await store.put(original, await plainPng(300, 17000), 'application/octet-stream');
			const row = await Photo.create({
				ownerId: author.id,
				guideId: (await Guide.findOne({ where: { slug: 'quiet-box' } }))?.id ?? null,
				keyPrefix: 'photos/accepted-before-the-check',
				width: 300,
				height: 17000,
				bytes: 1000,
				placeholder: '',
				variants: [],
				state: 'processing',
				variantsTotal: 3,
				originalKey: original
			});
			expect(await worker().runOnce()).toBe(true);
			const failed = await Photo.findByPk(row.id);
			expect(failed?.state).toBe('failed');
			expect(failed?.attempts).toBe(1);
			expect(failed?.failure).toMatch(/17000 pixels tall.*at most 16383 pixels on a side/);
			expect(await store.list('')).toEqual([]);
			expect(await worker().runOnce()).toBe(false);
		});

		it('a waiting part upload whose claim another worker takes over answers 503 and leaves nothing stored', async () => {
			const editor = await fanAndEditor();
			// The waiting upload's claim lasts a millisecond, so another app process's worker (here,
			// the loop below) takes the photo over while it is being made: the upload loses it.
			process.env.PHOTO_LEASE_SECONDS = '0.001';
			let uploading = true;
			let takenOver = false;
			const otherWorker = (async () => {
				while (uploading) {
					if (await worker().runOnce()) takenOver = true;
					await new Promise((r) => setTimeout(r, 2));
				}
			})();
			let outcome;
			try {
				outcome = await photos.upload(
					{ id: editor.id, role: 'editor' },
					{ kind: 'part', slug: 'draftwell-breeze-120' },
					await large(),
					{ caption: '', altText: 'The fan from the front' }
				);
			} finally {
				uploading = false;
				delete process.env.PHOTO_LEASE_SECONDS;
				await otherWorker;
			}
			expect(takenOver).toBe(true);
			expect(await Photo.count()).toBe(0);
			// Neither the original nor any file either worker made.
			expect(await store.list('')).toEqual([]);
			// Not the uploader's fault: try again, rather than a refusal of the file.
			expect(outcome).toMatchObject({ kind: 'rejected', status: 503 });
		});

		it('cancelled while processing: the row, the original and every file made go', async () => {
			const status = await accept();
			const running = worker().runOnce();
			// Cancel once the job has made its first file.
			for (;;) {
				const row = await Photo.findByPk(status.id, { attributes: ['variantsDone'] });
				if ((row?.variantsDone ?? 0) >= 1) break;
				await new Promise((r) => setTimeout(r, 5));
			}
			expect(await photos.remove(actor(), guide, status.id)).toEqual({ kind: 'ok' });
			await running;
			expect(await Photo.count()).toBe(0);
			expect(await store.list('')).toEqual([]);
		});
	});
}
