/*
 * A local S3-compatible server (s3rver, from npm) on loopback and a free port, for the
 * storage integration tests: the same suite runs against it as against the disk store.
 * Files go to a temporary folder that is removed on stop.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { createServer } from 'node:net';

interface S3rverInstance {
	run(): Promise<unknown>;
	close(): Promise<unknown>;
}
type S3rverClass = new (options: Record<string, unknown>) => S3rverInstance;

function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => resolve(port));
		});
	});
}

export interface S3Fake {
	endpoint: string;
	bucket: string;
	/** s3rver's fixed development credentials. */
	accessKeyId: string;
	secretAccessKey: string;
	stop(): Promise<void>;
}

export async function startS3Fake(bucket = 'slotwise-photos'): Promise<S3Fake> {
	// s3rver ships CommonJS without types.
	const S3rver = createRequire(import.meta.url)('s3rver') as S3rverClass;
	const directory = await mkdtemp(join(tmpdir(), 'slotwise-s3-'));
	const port = await freePort();
	const server = new S3rver({
		address: '127.0.0.1',
		port,
		silent: true,
		directory,
		configureBuckets: [{ name: bucket }]
	});
	await server.run();
	return {
		endpoint: `http://127.0.0.1:${port}`,
		bucket,
		accessKeyId: 'S3RVER',
		secretAccessKey: 'S3RVER',
		async stop() {
			await server.close();
			await rm(directory, { recursive: true, force: true });
		}
	};
}
