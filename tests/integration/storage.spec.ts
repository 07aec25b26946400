/*
 * The photo store's one interface (src/lib/server/storage), one suite, two drivers: local
 * disk, and S3 through @aws-sdk/client-s3 against a local S3 fake (s3rver) on loopback.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { diskStorage, s3Storage } from '../../src/lib/server/storage';
import type { ObjectStorage } from '../../src/lib/server/storage';
import { startS3Fake } from '../support/s3-fake';
import type { S3Fake } from '../support/s3-fake';

type Driver = { name: string; open(): Promise<ObjectStorage>; close(): Promise<void> };

let folder = '';
let fake: S3Fake | null = null;
const drivers: Driver[] = [
	{
		name: 'disk',
		async open() {
			folder = await mkdtemp(join(tmpdir(), 'slotwise-disk-'));
			return diskStorage(folder);
		},
		async close() {
			await rm(folder, { recursive: true, force: true });
		}
	},
	{
		name: 's3 (s3rver on loopback)',
		async open() {
			fake = await startS3Fake();
			return s3Storage({
				bucket: fake.bucket,
				endpoint: fake.endpoint,
				region: 'us-east-1',
				forcePathStyle: true,
				accessKeyId: fake.accessKeyId,
				secretAccessKey: fake.secretAccessKey
			});
		},
		async close() {
			await fake?.stop();
		}
	}
];

function storageSuite(driver: Driver) {
	describe(`photo store: ${driver.name}`, () => {
		let store: ObjectStorage;
		beforeAll(async () => {
			store = await driver.open();
		});
		afterAll(() => driver.close());

		it('stores bytes under a key and gives the same bytes and our content type back', async () => {
			const body = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 250]);
			await store.put('photos/abc123/480.jpg', body, 'image/jpeg');
			const back = await store.get('photos/abc123/480.jpg');
			expect(back).not.toBeNull();
			expect([...(back?.body ?? [])]).toEqual([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 250]);
			expect(back?.contentType).toBe('image/jpeg');
		});

		it('answers null for a key that holds nothing', async () => {
			expect(await store.get('photos/nothing-here/480.webp')).toBeNull();
		});

		it('overwrites a key with the newer bytes', async () => {
			await store.put('photos/over/960.webp', new Uint8Array([1]), 'image/webp');
			await store.put('photos/over/960.webp', new Uint8Array([2, 2]), 'image/webp');
			expect([...((await store.get('photos/over/960.webp'))?.body ?? [])]).toEqual([2, 2]);
		});

		it('lists the keys under a prefix, and only those', async () => {
			await store.put('photos/listme/480.avif', new Uint8Array([1]), 'image/avif');
			await store.put('photos/listme/960.avif', new Uint8Array([2]), 'image/avif');
			await store.put('photos/other/480.avif', new Uint8Array([3]), 'image/avif');
			expect(await store.list('photos/listme/')).toEqual([
				'photos/listme/480.avif',
				'photos/listme/960.avif'
			]);
		});

		it('deletes every key given, and a missing key is not an error', async () => {
			await store.delete([
				'photos/listme/480.avif',
				'photos/listme/960.avif',
				'photos/never/1.jpg'
			]);
			expect(await store.list('photos/listme/')).toEqual([]);
			expect(await store.get('photos/listme/480.avif')).toBeNull();
			expect(await store.list('photos/other/')).toEqual(['photos/other/480.avif']);
		});

		it('refuses keys that could leave the store', async () => {
			for (const key of [
				'../etc/passwd',
				'photos/../../x.jpg',
				'/abs/x.jpg',
				'photos/a b.jpg',
				''
			]) {
				await expect(store.put(key, new Uint8Array([1]), 'image/jpeg')).rejects.toThrow(
					/Invalid storage key/
				);
			}
		});
	});
}

for (const driver of drivers) storageSuite(driver);
