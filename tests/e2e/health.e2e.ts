import { expect, test } from '@playwright/test';
import { execFileSync, spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { freePort } from './support';

/*
 * A real outage: this test runs its own MariaDB (separate datadir and port) and its own
 * production server against it, stops the database, and watches /api/health.
 */
const ROOT = resolve(import.meta.dirname, '../..');
// Ports picked free at start, so a second checkout or a developer's own instance never clashes.
let DB_PORT = '';
let APP_PORT = 0;
let URL = '';

test.describe.configure({ timeout: 120_000 });

let dataDir: string;
let server: ChildProcess | undefined;
const dbEnv = () => ({
	...process.env,
	SLOTWISE_DATA_DIR: dataDir,
	DB_PORT,
	DB_NAMES: 'slotwise_health'
});
const db = (command: 'start' | 'stop') =>
	execFileSync('bash', [join(ROOT, 'scripts/db.sh'), command], { env: dbEnv(), stdio: 'pipe' });

async function getHealth(): Promise<{ status: number; body: unknown; ms: number }> {
	const started = Date.now();
	const response = await fetch(URL, { signal: AbortSignal.timeout(5_000) });
	return { status: response.status, body: await response.json(), ms: Date.now() - started };
}

test.beforeAll(async () => {
	dataDir = mkdtempSync(join(tmpdir(), 'slotwise-health-'));
	DB_PORT = String(await freePort());
	APP_PORT = await freePort();
	URL = `http://127.0.0.1:${APP_PORT}/api/health`;
	db('start');
	server = spawn('node', ['build'], {
		cwd: ROOT,
		env: {
			...process.env,
			PORT: String(APP_PORT),
			HOST: '127.0.0.1',
			ORIGIN: `http://127.0.0.1:${APP_PORT}`,
			DB_PORT,
			DB_NAME: 'slotwise_health',
			LOG_LEVEL: 'silent'
		},
		stdio: 'ignore'
	});
	await expect
		.poll(
			() =>
				getHealth()
					.then((h) => h.status)
					.catch(() => 0),
			{ timeout: 20_000 }
		)
		.toBe(200);
});

test.afterAll(async () => {
	server?.kill('SIGTERM');
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
