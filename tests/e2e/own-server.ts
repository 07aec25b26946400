import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { resolve } from 'node:path';
import { freePort } from './support';

/*
 * A production server (`node build`) of a test's own, for what the shared one cannot show:
 * another listen address or public origin, a database that is stopped, or the server's log.
 * It listens on a free port; its output is kept for the test to read.
 */
export const ROOT = resolve(import.meta.dirname, '../..');

export interface OwnServer {
	/** Where to send requests: always plain http on 127.0.0.1, whatever ORIGIN says. */
	url: string;
	/** The public origin the server believes it has (ORIGIN), for Origin headers. */
	origin: string;
	/** Everything the server wrote to stdout and stderr so far. */
	output(): string;
	stop(): Promise<void>;
}

export async function startOwnServer(env: Record<string, string> = {}): Promise<OwnServer> {
	const port = await freePort();
	const url = `http://127.0.0.1:${port}`;
	const origin = env.ORIGIN ?? url;
	let output = '';
	const child: ChildProcess = spawn('node', ['build'], {
		cwd: ROOT,
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: origin,
			BODY_SIZE_LIMIT: '2M',
			DB_NAME: process.env.DB_NAME ?? 'slotwise_e2e',
			LOG_LEVEL: 'silent',
			...env
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString('utf8')));
	child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString('utf8')));
	const exited = new Promise<void>((done) => child.once('exit', () => done()));

	const deadline = Date.now() + 30_000;
	for (;;) {
		const status = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2_000) })
			.then((r) => r.status)
			.catch(() => 0);
		if (status === 200) break;
		if (child.exitCode !== null || Date.now() > deadline) {
			child.kill('SIGKILL');
			throw new Error(`own server did not come up on ${url}:\n${output}`);
		}
		await new Promise((r) => setTimeout(r, 250));
	}
	return {
		url,
		origin,
		output: () => output,
		async stop() {
			if (child.exitCode === null) child.kill('SIGTERM');
			await Promise.race([exited, new Promise((r) => setTimeout(r, 5_000))]);
			if (child.exitCode === null) child.kill('SIGKILL');
		}
	};
}
