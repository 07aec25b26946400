/*
 * The two photo stores every photo integration test runs against: a temporary folder on disk,
 * and the S3 store through @aws-sdk/client-s3 and a local S3 fake (s3rver) on loopback,
 * configured through the same variables the app reads (STORAGE_DRIVER=s3 and the S3_* names).
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import { createGuideInput } from '../../src/lib/schemas/guide-editor';
import { Region, User } from '../../src/lib/server/db';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import { diskStorage, storageFromEnv } from '../../src/lib/server/storage';
import type { ObjectStorage } from '../../src/lib/server/storage';
import { startS3Fake } from './s3-fake';
import type { S3Fake } from './s3-fake';
import { resetDatabase } from './db';

export type PhotoStoreDriver = {
	name: string;
	open(): Promise<ObjectStorage>;
	close(): Promise<void>;
};

export function photoStoreDrivers(): PhotoStoreDriver[] {
	let folder = '';
	let fake: S3Fake | null = null;
	return [
		{
			name: 'disk',
			async open() {
				folder = await mkdtemp(join(tmpdir(), 'slotwise-photos-'));
				return diskStorage(folder);
			},
			close: () => rm(folder, { recursive: true, force: true })
		},
		{
			name: 'S3 (s3rver on loopback)',
			async open() {
				fake = await startS3Fake();
				const configured = storageFromEnv({
					STORAGE_DRIVER: 's3',
					S3_BUCKET: fake.bucket,
					S3_ENDPOINT: fake.endpoint,
					S3_REGION: 'us-east-1',
					S3_ACCESS_KEY_ID: fake.accessKeyId,
					S3_SECRET_ACCESS_KEY: fake.secretAccessKey
				});
				expect(configured.kind).toBe('s3');
				return configured;
			},
			close: async () => {
				await fake?.stop();
			}
		}
	];
}

/**
 * The world every photo integration test starts from: empty tables and an empty `store`, two
 * authors (Ada, who owns the guide, and Ben, who does not), the United States region and
 * Ada's draft guide "Quiet box" (slug quiet-box).
 */
export async function quietBoxGuide(store: ObjectStorage): Promise<{ author: User; other: User }> {
	await resetDatabase();
	await store.delete(await store.list(''));
	const author = await User.create({
		email: 'ada@example.test',
		name: 'Ada Writer',
		role: 'author'
	});
	const other = await User.create({ email: 'ben@example.test', name: 'Ben Other', role: 'author' });
	await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0
	});
	const created = await draftEdits.createGuide(
		author.id,
		createGuideInput.parse({
			title: 'Quiet box',
			summary: 'A quiet build.',
			targetBudget: '900',
			baseRegion: 'us',
			disclosure: 'none'
		})
	);
	expect(created.kind).toBe('created');
	return { author, other };
}
