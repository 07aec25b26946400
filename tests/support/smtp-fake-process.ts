/*
 * A private copy of the local SMTP fake (scripts/smtp-fake.ts) in its own process on free
 * ports, for tests that count every message or set refusal rules without touching the
 * shared mailbox `npm test` runs. Real SMTP protocol, real child process.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { resolve } from 'node:path';

const ROOT = resolve(import.meta.dirname, '../..');

export function freePort(): Promise<number> {
	return new Promise((done, fail) => {
		const server = createServer();
		server.once('error', fail);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => done(port));
		});
	});
}

export interface RefusalRule {
	localPart: string;
	code: number;
	times?: number;
}

export interface FakeSmtp {
	smtpPort: number;
	mailboxUrl: string;
	/** Messages accepted since the last clear (cheap to poll). */
	accepted(): Promise<number>;
	counts(): Promise<{ total: number; recipients: Record<string, number> }>;
	deliveries(messageId: string): Promise<number>;
	setRules(rules: RefusalRule[]): Promise<void>;
	setDataDelay(ms: number): Promise<void>;
	clear(): Promise<void>;
	stop(): Promise<void>;
}

async function call(url: string, init?: RequestInit): Promise<Response> {
	const response = await fetch(url, { ...init, signal: AbortSignal.timeout(10_000) });
	if (!response.ok) throw new Error(`${init?.method ?? 'GET'} ${url} answered ${response.status}`);
	return response;
}

/** @param keepBodies false: count only (SMTP_FAKE_KEEP=0), for thousands of messages. */
export async function startFakeSmtp({ keepBodies = true } = {}): Promise<FakeSmtp> {
	const smtpPort = await freePort();
	const httpPort = await freePort();
	const child: ChildProcess = spawn(
		process.execPath,
		// tsx as a loader in this one process, so stopping it stops the fake itself.
		['--import', 'tsx', resolve(ROOT, 'scripts/smtp-fake.ts')],
		{
			cwd: ROOT,
			env: {
				...process.env,
				SMTP_PORT: String(smtpPort),
				MAILBOX_PORT: String(httpPort),
				SMTP_FAKE_QUIET: '1',
				SMTP_FAKE_KEEP: keepBodies ? '1' : '0'
			},
			stdio: ['ignore', 'ignore', 'inherit']
		}
	);
	const mailboxUrl = `http://127.0.0.1:${httpPort}`;
	const until = Date.now() + 30_000;
	for (;;) {
		try {
			if ((await fetch(`${mailboxUrl}/health`)).ok) break;
		} catch {
			// not listening yet
		}
		if (child.exitCode !== null) throw new Error('the SMTP fake exited at start');
		if (Date.now() > until) {
			child.kill('SIGKILL');
			throw new Error('the SMTP fake did not start within 30 s');
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	const json = { 'content-type': 'application/json' };
	return {
		smtpPort,
		mailboxUrl,
		async accepted() {
			return ((await (await call(`${mailboxUrl}/health`)).json()) as { accepted: number }).accepted;
		},
		async counts() {
			return (await (await call(`${mailboxUrl}/counts`)).json()) as {
				total: number;
				recipients: Record<string, number>;
			};
		},
		async deliveries(messageId) {
			const body = (await (
				await call(`${mailboxUrl}/deliveries/${encodeURIComponent(messageId)}`)
			).json()) as { count: number };
			return body.count;
		},
		async setRules(rules) {
			await call(`${mailboxUrl}/rules`, {
				method: 'PUT',
				headers: json,
				body: JSON.stringify(rules)
			});
		},
		async setDataDelay(ms) {
			await call(`${mailboxUrl}/settings`, {
				method: 'PUT',
				headers: json,
				body: JSON.stringify({ dataDelayMs: ms })
			});
		},
		async clear() {
			await call(`${mailboxUrl}/messages`, { method: 'DELETE' });
			await call(`${mailboxUrl}/rules`, { method: 'DELETE' });
		},
		async stop() {
			if (child.exitCode !== null || child.signalCode !== null) return;
			const exited = new Promise((r) => child.once('exit', r));
			child.kill('SIGTERM');
			await exited;
		}
	};
}
