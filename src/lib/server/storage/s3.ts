/*
 * Photo files in an S3-compatible object store through @aws-sdk/client-s3. Path-style
 * addressing by default, because self-hosted stores (and the local fake the tests use)
 * serve buckets under the endpoint's path rather than as subdomains.
 */
import {
	DeleteObjectsCommand,
	GetObjectCommand,
	ListObjectsV2Command,
	NoSuchKey,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import { assertKey, contentTypeOf } from './types.js';
import type { ObjectStorage } from './types.js';

export interface S3Config {
	bucket: string;
	endpoint?: string;
	region: string;
	forcePathStyle: boolean;
	accessKeyId?: string;
	secretAccessKey?: string;
}

export function s3Storage(config: S3Config): ObjectStorage {
	const client = new S3Client({
		region: config.region,
		endpoint: config.endpoint,
		forcePathStyle: config.forcePathStyle,
		credentials:
			config.accessKeyId && config.secretAccessKey
				? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey }
				: undefined,
		// A hung store must not hold an upload or a page for minutes.
		requestHandler: { requestTimeout: 15_000, connectionTimeout: 3_000 }
	});
	const Bucket = config.bucket;

	return {
		kind: 's3',

		async put(key, body, contentType) {
			assertKey(key);
			await client.send(
				new PutObjectCommand({
					Bucket,
					Key: key,
					Body: body,
					ContentType: contentType,
					CacheControl: 'public, max-age=31536000, immutable'
				})
			);
		},

		async get(key) {
			assertKey(key);
			try {
				const answer = await client.send(new GetObjectCommand({ Bucket, Key: key }));
				if (!answer.Body) return null;
				const body = await answer.Body.transformToByteArray();
				// Our own type by extension wins over whatever the store echoes back.
				return { body, contentType: contentTypeOf(key) ?? 'application/octet-stream' };
			} catch (e) {
				if (e instanceof NoSuchKey || (e as { name?: string }).name === 'NoSuchKey') return null;
				throw e;
			}
		},

		async delete(keys) {
			for (const key of keys) assertKey(key);
			// DeleteObjects takes at most 1000 keys per call.
			for (let i = 0; i < keys.length; i += 1000) {
				const chunk = keys.slice(i, i + 1000);
				await client.send(
					new DeleteObjectsCommand({
						Bucket,
						Delete: { Objects: chunk.map((Key) => ({ Key })), Quiet: true }
					})
				);
			}
		},

		async list(prefix) {
			const keys: string[] = [];
			let token: string | undefined;
			do {
				const page = await client.send(
					new ListObjectsV2Command({ Bucket, Prefix: prefix, ContinuationToken: token })
				);
				for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
				token = page.IsTruncated ? page.NextContinuationToken : undefined;
			} while (token);
			return keys.sort();
		}
	};
}
