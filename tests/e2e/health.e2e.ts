import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startOwnServer, ROOT, type OwnServer } from './own-server';
import { DEMO_PASSWORD, freePort } from './support';

/*
 * A real outage: this file runs its own MariaDB (separate datadir and port, migrated and
 * seeded with the demo) and its own production server against it, then stops and restarts
 * the database (docs/security.md §7; issue 12, item 6 and its "done when").
 */
const DB_NAME = 'slotwise_health';
let DB_PORT = '';

test.describe.configure({ mode: 'serial', timeout: 180_000 });

let dataDir: string;
let server: OwnServer;
const dbEnv = () => ({
	...process.env,
	SLOTWISE_DATA_DIR: dataDir,
	DB_PORT,
	DB_NAMES: DB_NAME,
	DB_NAME
});
const db = (command: 'start' | 'stop') =>
	execFileSync('bash', [join(ROOT, 'scripts/db.sh'), command], { env: dbEnv(), stdio: 'pipe' });
const tsx = (script: string) =>
	execFileSync('npx', ['tsx', join(ROOT, script), 'up'], {
		cwd: ROOT,
		env: dbEnv(),
		stdio: 'pipe'
	});

interface Answer {
	status: number;
	ms: number;
	body: string;
	type: string;
	retryAfter: string | null;
	setCookies: string[];
}

async function get(path: string, cookie = ''): Promise<Answer> {
	const started = Date.now();
	const response = await fetch(`${server.url}${path}`, {
		headers: cookie ? { cookie, accept: 'text/html' } : { accept: 'text/html' },
		redirect: 'manual',
		signal: AbortSignal.timeout(10_000)
	});
	const body = await response.text();
	return {
		status: response.status,
		ms: Date.now() - started,
		body,
		type: response.headers.get('content-type') ?? '',
		retryAfter: response.headers.get('retry-after'),
		setCookies: response.headers.getSetCookie()
	};
}

async function getHealth(): Promise<{ status: number; body: unknown; ms: number }> {
	const started = Date.now();
	const response = await fetch(`${server.url}/api/health`, { signal: AbortSignal.timeout(5_000) });
	return { status: response.status, body: await response.json(), ms: Date.now() - started };
}

test.beforeAll(async () => {
	// Migrating and seeding a fresh database takes a while on a busy machine.
	test.setTimeout(180_000);
	dataDir = mkdtempSync(join(tmpdir(), 'slotwise-health-'));
	DB_PORT = String(await freePort());
	db('start');
	tsx('scripts/migrate.ts');
	tsx('scripts/seed.ts');
	server = await startOwnServer({ DB_PORT, DB_NAME });
});

test.afterAll(async () => {
	test.setTimeout(60_000);
	await server?.stop();
	try {
		db('stop');
	} finally {
		rmSync(dataDir, { recursive: true, force: true });
	}
});

test('health answers 503 quickly while MariaDB is down and 200 again once it is back', async () => {
	expect(await getHealth()).toMatchObject({ status: 200, body: { status: 'ok', db: 'up' } });

	db('stop');
	for (let i = 0; i < 3; i++) {
		const down = await getHealth();
		expect(down.status).toBe(503);
		expect(down.body).toEqual({ status: 'degraded', db: 'down' });
		expect(down.ms, 'answered within 2 s').toBeLessThan(2_000);
	}

	db('start');
	const backAt = Date.now();
	await expect
		.poll(() => getHealth().then((h) => h.status), { timeout: 10_000, intervals: [250] })
		.toBe(200);
	expect(Date.now() - backAt).toBeLessThan(10_000);
});

test('during an outage pages and API answer a calm 503 fast, sessions survive, and nothing acknowledged is lost (item 6)', async () => {
	// Sign in on this server.
	const signIn = await fetch(`${server.url}/signin?/password`, {
		method: 'POST',
		body: new URLSearchParams({ email: 'reader@slotwise.test', password: DEMO_PASSWORD }),
		headers: { origin: server.origin, accept: 'text/html' },
		redirect: 'manual'
	});
	expect(signIn.status).toBe(303);
	const cookie = signIn.headers
		.getSetCookie()
		.map((c) => c.split(';')[0] ?? '')
		.filter((c) => c.includes('session-token'))
		.join('; ');
	expect(cookie).not.toBe('');
	const signedInAs = async () => {
		const response = await fetch(`${server.url}/auth/session`, { headers: { cookie } });
		if (response.status !== 200) return null;
		return ((await response.json()) as { user?: { email?: string } } | null)?.user?.email ?? null;
	};
	expect(await signedInAs()).toBe('reader@slotwise.test');

	// A writer forks a guide again and again, through the outage; it records each fork
	// only once the server acknowledged it (201 with its id).
	const acknowledged: number[] = [];
	const writeStatuses: number[] = [];
	let writing = true;
	const writer = (async () => {
		while (writing && writeStatuses.length < 18) {
			const response = await fetch(`${server.url}/api/v1/guides/pocket-itx-1440p/fork`, {
				method: 'POST',
				body: '{}',
				headers: { cookie, 'content-type': 'application/json', origin: server.origin },
				signal: AbortSignal.timeout(10_000)
			}).catch(() => null);
			writeStatuses.push(response?.status ?? 0);
			if (response?.status === 201)
				acknowledged.push(((await response.json()) as { id: number }).id);
			await new Promise((r) => setTimeout(r, 300));
		}
	})();
	await expect.poll(() => acknowledged.length, { timeout: 10_000 }).toBeGreaterThanOrEqual(2);

	db('stop');
	for (const path of ['/', '/guides/steady-1080p-starter', '/api/v1/guides']) {
		for (const who of ['visitor', 'reader'] as const) {
			const answer = await get(path, who === 'reader' ? cookie : '');
			const what = `${who} ${path}`;
			expect(answer.status, what).toBe(503);
			expect(answer.ms, `${what} answered within 2 s`).toBeLessThan(2_000);
			expect(Number(answer.retryAfter), what).toBeGreaterThan(0);
			// The session cookie is never cleared because the database could not be asked.
			expect(
				answer.setCookies.filter((c) =>
					/session-token=;|session-token=.*(Max-Age=0|Expires=Thu, 01 Jan 1970)/i.test(c)
				),
				what
			).toEqual([]);
			if (path.startsWith('/api/')) {
				expect(answer.type, what).toContain('application/json');
				expect(JSON.parse(answer.body), what).toEqual({ message: expect.any(String) });
			} else {
				expect(answer.type, what).toContain('text/html');
				expect(answer.body, what).toMatch(/cannot reach its database|briefly unavailable/i);
				expect(answer.body, what).not.toMatch(/Something went wrong/);
			}
		}
	}
	await new Promise((r) => setTimeout(r, 1_500));

	db('start');
	// The app recovers by itself, and the reader is still signed in with the same cookie.
	await expect.poll(signedInAs, { timeout: 15_000, intervals: [250] }).toBe('reader@slotwise.test');
	const account = await get('/account', cookie);
	expect(account.status).toBe(200);

	await expect
		.poll(() => writeStatuses.slice(-1)[0], { timeout: 15_000, intervals: [250] })
		.toBe(201);
	writing = false;
	await writer;
	// Every answer was an acknowledgement or a 503 while the database was away: never a 500.
	expect(writeStatuses.filter((s) => s !== 201 && s !== 503)).toEqual([]);
	expect(writeStatuses).toContain(503);
	for (const id of acknowledged) {
		const build = await fetch(`${server.url}/api/v1/builds/${id}`, { headers: { cookie } });
		expect(build.status, `acknowledged fork ${id} is stored`).toBe(200);
	}
});
