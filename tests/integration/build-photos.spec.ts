/*
 * Photos of a finished build, on the real MariaDB, the real pipeline (sharp) and both photo
 * stores: the build's owner adds them to a public build (the same pipeline and checks as every
 * photo, processed while they wait, at most 12 per build); nobody else can, and a private or
 * unlisted build takes none; a reader can report one and an editor hide it like any content,
 * which stops its files being served; deleting it removes every stored file.
 */
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { Build, ContentReport, Photo, Region, User } from '../../src/lib/server/db';
import { useStorage } from '../../src/lib/server/storage';
import type { ObjectStorage } from '../../src/lib/server/storage';
import { newShareToken } from '../../src/lib/server/services/build-fork';
import * as contentReports from '../../src/lib/server/services/content-reports';
import * as photos from '../../src/lib/server/services/photos';
import { GET as mediaRoute } from '../../src/routes/media/[...key]/+server';
import { resetDatabase } from '../support/db';
import { jpegWithGps } from '../support/images';
import { photoStoreDrivers } from '../support/photo-stores';

let store: ObjectStorage;
let owner: User;
let otherReader: User;
let editor: User;
let build: Build;

const text = { caption: 'Cables tied down', altText: 'The finished build from the side' };
const target = () => ({ kind: 'build', id: build.id }) as const;
const asOwner = () => ({ id: owner.id, role: 'reader' });

type MediaEvent = Parameters<typeof mediaRoute>[0];
const serve = (key: string) => mediaRoute({ params: { key } } as unknown as MediaEvent);

beforeEach(async () => {
	await resetDatabase();
	await store.delete(await store.list(''));
	owner = await User.create({ email: 'rae@example.test', name: 'Rae Reader', role: 'reader' });
	otherReader = await User.create({ email: 'sam@example.test', name: 'Sam Other', role: 'reader' });
	editor = await User.create({ email: 'eve@example.test', name: 'Eve Editor', role: 'editor' });
	const region = await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0
	});
	build = await Build.create({
		ownerId: owner.id,
		sourceGuideId: null,
		baseRevisionId: null,
		title: 'Quiet walnut box',
		regionId: region.id,
		visibility: 'public',
		shareToken: newShareToken(),
		notes: ''
	});
});

/** The owner's upload of a 1200 × 800 JPEG carrying GPS, processed while they wait. */
async function addPhoto() {
	const outcome = await photos.upload(asOwner(), target(), await jpegWithGps(1200, 800), text);
	if (outcome.kind !== 'ok') throw new Error(outcome.kind);
	return outcome.photo;
}

for (const driver of photoStoreDrivers()) {
	describe(`build photos with the ${driver.name} photo store`, () => {
		beforeAll(async () => {
			store = await driver.open();
			useStorage(store);
		});
		afterAll(async () => {
			useStorage(undefined);
			await driver.close();
		});

		it("the owner adds a photo to their public build: made upright without GPS, shown on the build's page", async () => {
			const photo = await addPhoto();
			// Orientation 6 turns 1200 × 800 into 800 × 1200: only the 480 width, 720 tall.
			expect(photo.variants.map((v) => `${v.format} ${v.width}×${v.height}`)).toEqual([
				'avif 480×720',
				'webp 480×720',
				'jpeg 480×720'
			]);
			expect([photo.caption, photo.altText]).toEqual([text.caption, text.altText]);
			expect(await store.list('originals/')).toEqual([]);
			const keys = await store.list('photos/');
			expect(keys).toHaveLength(3);
			for (const key of keys) {
				const bytes = Buffer.from((await store.get(key))?.body ?? []);
				expect(await exifr.gps(bytes).catch(() => undefined), key).toBeUndefined();
			}
			expect((await photos.buildPhotos(build.id)).map((p) => p.id)).toEqual([photo.id]);
		});

		it('refuses a file the pipeline refuses, with the same answer and nothing stored', async () => {
			const tall = await sharp({
				create: { width: 300, height: 17000, channels: 3, background: '#55606e' }
			})
				.png()
				.toBuffer();
			const outcome = await photos.upload(asOwner(), target(), tall, text);
			expect(outcome).toMatchObject({ kind: 'rejected', status: 422 });
			if (outcome.kind === 'rejected') expect(outcome.message).toMatch(/at most 16383 pixels/);
			expect(await store.list('')).toEqual([]);
			expect(await Photo.count()).toBe(0);
		});

		it('takes at most 12 photos, failed ones not counted', async () => {
			const filler = (i: number, state: 'ready' | 'failed') =>
				Photo.create({
					ownerId: owner.id,
					buildId: build.id,
					keyPrefix: `photos/filler-${i}`,
					width: 800,
					height: 600,
					bytes: state === 'ready' ? 1000 : 0,
					placeholder: '',
					variants: [],
					state
				});
			for (let i = 0; i < 11; i++) await filler(i, 'ready');
			await filler(11, 'failed');
			expect((await photos.upload(asOwner(), target(), await jpegWithGps(), text)).kind).toBe('ok');
			const full = await photos.upload(asOwner(), target(), await jpegWithGps(), text);
			expect(full).toEqual({
				kind: 'conflict',
				message: 'At most 12 photos here; delete one first.'
			});
			expect(await Photo.count()).toBe(13);
		});

		it('nobody else can add a photo to it: not found, nothing stored', async () => {
			const outcome = await photos.upload(
				{ id: otherReader.id, role: 'reader' },
				target(),
				await jpegWithGps(),
				text
			);
			expect(outcome).toEqual({ kind: 'not_found' });
			expect(await store.list('')).toEqual([]);
			expect(await Photo.count()).toBe(0);
		});

		for (const visibility of ['private', 'unlisted'] as const)
			it(`a ${visibility} build takes no photos: refused with the reason, nothing stored`, async () => {
				await build.update({ visibility });
				const outcome = await photos.upload(asOwner(), target(), await jpegWithGps(), text);
				expect(outcome).toEqual({
					kind: 'conflict',
					message: 'Photos of a finished build are shown to everyone: make the build public first.'
				});
				expect(await store.list('')).toEqual([]);
				expect(await Photo.count()).toBe(0);
			});

		it('a reader reports the photo and an editor hides it: off the page, its files no longer served', async () => {
			const photo = await addPhoto();
			const report = {
				category: 'spam' as const,
				detail: 'The photo shows an advert, not the build.'
			};
			expect(
				await contentReports.report(owner.id, 'photo', String(photo.id), report)
			).toMatchObject({ kind: 'conflict' });
			expect(
				await contentReports.report(otherReader.id, 'photo', String(photo.id), report)
			).toMatchObject({ kind: 'ok', created: true });

			const subject = { type: 'photo' as const, id: String(photo.id) };
			const reason = 'An advert for another shop, not a photo of this build.';
			expect(await contentReports.hide(editor.id, subject, reason)).toEqual({
				kind: 'ok',
				closedReports: 1
			});
			expect(await ContentReport.count({ where: { state: 'actioned' } })).toBe(1);
			expect(await photos.buildPhotos(build.id)).toEqual([]);
			expect((await photos.buildPhotos(build.id, true)).map((p) => [p.id, p.hidden])).toEqual([
				[photo.id, true]
			]);
			const key = photo.variants[0]?.url.replace(/^\/media\//, '') ?? '';
			await expect(serve(key)).rejects.toMatchObject({ status: 404 });
			// A hidden photo cannot be reported again.
			expect(
				await contentReports.report(otherReader.id, 'photo', String(photo.id), report)
			).toEqual({ kind: 'not_found' });

			expect(await contentReports.restore(editor.id, subject)).toEqual({ kind: 'ok' });
			expect((await photos.buildPhotos(build.id)).map((p) => p.id)).toEqual([photo.id]);
			expect((await serve(key)).status).toBe(200);
		});

		it('deleting the photo removes the row and every stored file; nobody else can delete it', async () => {
			const photo = await addPhoto();
			expect(
				await photos.remove({ id: otherReader.id, role: 'reader' }, target(), photo.id)
			).toEqual({ kind: 'not_found' });
			expect(await store.list('photos/')).toHaveLength(3);
			expect(await photos.remove(asOwner(), target(), photo.id)).toEqual({ kind: 'ok' });
			expect(await store.list('')).toEqual([]);
			expect(await Photo.count()).toBe(0);
		});
	});
}
