/*
 * The process-wide photo store, chosen by configuration (plain process.env so scripts and
 * the seed can use it): STORAGE_DRIVER=disk (default, UPLOADS_DIR or .data/uploads/<DB_NAME>) or
 * STORAGE_DRIVER=s3 (S3_BUCKET, S3_ENDPOINT, S3_REGION, S3_FORCE_PATH_STYLE,
 * S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY; without keys the AWS SDK's default chain).
 */
import { resolve } from 'node:path';
import { diskStorage } from './disk.js';
import { s3Storage } from './s3.js';
import type { ObjectStorage } from './types.js';

export type { ObjectStorage, StoredObject } from './types.js';
export { contentTypeOf, isValidKey } from './types.js';
export { diskStorage, s3Storage };

export function storageFromEnv(env: NodeJS.ProcessEnv = process.env): ObjectStorage {
	const driver = (env.STORAGE_DRIVER ?? 'disk').toLowerCase();
	if (driver === 's3') {
		if (!env.S3_BUCKET) throw new Error('STORAGE_DRIVER=s3 needs S3_BUCKET.');
		return s3Storage({
			bucket: env.S3_BUCKET,
			endpoint: env.S3_ENDPOINT || undefined,
			region: env.S3_REGION || 'us-east-1',
			forcePathStyle: (env.S3_FORCE_PATH_STYLE ?? (env.S3_ENDPOINT ? 'true' : 'false')) === 'true',
			accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
			secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined
		});
	}
	if (driver !== 'disk') throw new Error(`Unknown STORAGE_DRIVER "${driver}" (disk or s3).`);
	// One folder per database, so the test databases' photos never mix with the demo's.
	return diskStorage(env.UPLOADS_DIR || resolve('.data/uploads', env.DB_NAME || 'slotwise'));
}

let shared: ObjectStorage | undefined;

/** The configured store, created on first use. */
export function storage(): ObjectStorage {
	shared ??= storageFromEnv();
	return shared;
}

/** Tests point the app's services at a store of their choosing. */
export function useStorage(store: ObjectStorage | undefined): void {
	shared = store;
}
