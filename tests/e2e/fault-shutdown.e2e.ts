import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { Agent, request as httpRequest } from 'node:http';
import { join } from 'node:path';
import { runNote, writeReliabilitySection } from '../support/reliability-report';
import { ROOT, api, cleanUp, signIn, startApp } from './processes';

/*
 * SIGTERM to the app in the middle of a request. The request is made slow by its client, not
 * by the server: it sends the headers and half of a JSON body, the app starts handling it
 * and waits for the rest, the app gets SIGTERM, and only then does the client send the rest.
 * adapter-node stops accepting connections, lets the request finish, then emits
 * `sveltekit:shutdown`; our hook closes the database pools (hooks.server.ts), after which
 * nothing keeps the process alive and it exits with code 0. The request's connection is kept
 * alive, as a proxy's would be: its answer must say `Connection: close`, or the idle
 * connection holds the server open until Node's keep-alive timeout (server/shutdown.ts).
 */
test.describe.configure({ timeout: 90_000 });
test.afterAll(cleanUp);

const sleep = (ms: number) => new Promise((done) => setTimeout(done, ms));

test('SIGTERM mid-request: the request completes and is saved, the pools close, exit code 0', async () => {
	const database = process.env.DB_NAME ?? 'slotwise_e2e';
	// LOG_LEVEL info: the request log and the shutdown line are the evidence read below.
	const app = await startApp({ DB_NAME: database, LOG_LEVEL: 'info' });
	const reader = await signIn(app.origin, 'reader@slotwise.test');
	const forked = await api(
		app.origin,
		'POST',
		'/api/v1/guides/steady-1080p-starter/fork',
		reader,
		{}
	);
	expect(forked.status).toBe(201);
	const { id } = (await forked.json()) as { id: number };
	const title = `Saved during shutdown ${Date.now()}`;
	const body = Buffer.from(JSON.stringify({ version: 1, title }));

	// Headers and the first half of the body now; the rest after the SIGTERM.
	const url = new URL(`/api/v1/builds/${id}`, app.origin);
	let answered: (value: {
		status: number;
		body: string;
		at: number;
		connection: string;
	}) => void = () => {};
	const answer = new Promise<{ status: number; body: string; at: number; connection: string }>(
		(done) => (answered = done)
	);
	const pending = httpRequest(
		url,
		{
			method: 'PATCH',
			// Kept alive, as browsers and proxies keep their connections.
			agent: new Agent({ keepAlive: true }),
			headers: {
				cookie: reader,
				origin: app.origin,
				'content-type': 'application/json',
				'content-length': String(body.length)
			}
		},
		(response) => {
			let text = '';
			response.on('data', (chunk: Buffer) => (text += chunk.toString()));
			response.on('end', () =>
				answered({
					status: response.statusCode ?? 0,
					body: text,
					at: Date.now(),
					connection: response.headers.connection ?? ''
				})
			);
		}
	);
	pending.on('error', (error) =>
		answered({ status: 0, body: String(error), at: Date.now(), connection: '' })
	);
	pending.write(body.subarray(0, body.length >> 1));
	await sleep(500);
	const termAt = Date.now();
	app.child.kill('SIGTERM');

	// New connections are refused from now on… (The probe closes its connection after each
	// answer: a kept-alive idle connection would hold the server open until Node's 5 s
	// keep-alive timeout, which is the probe's doing, not the app's.)
	const probe = () =>
		new Promise<boolean>((done) => {
			const get = httpRequest(
				`${app.origin}/api/health`,
				{ agent: false, headers: { connection: 'close' } },
				(r) => {
					r.resume();
					r.on('end', () => done(false));
				}
			);
			get.on('error', () => done(true));
			get.end();
		});
	let refused = false;
	for (let i = 0; i < 40 && !refused; i++) {
		refused = await probe();
		if (!refused) await sleep(50);
	}
	expect(refused, 'new connections refused after SIGTERM').toBe(true);
	// …while the request in flight is still open: the process has not exited.
	await sleep(1_000);
	expect(app.child.exitCode).toBeNull();

	pending.end(body.subarray(body.length >> 1));
	const response = await answer;
	expect(response.status, response.body).toBe(200);
	expect(JSON.parse(response.body)).toMatchObject({ id, title, version: 2 });
	// The answer closes its kept-alive connection: nothing holds the server open after it.
	expect(response.connection).toBe('close');

	const exit = await Promise.race([app.exited, sleep(8_000).then(() => null)]);
	const exitAt = Date.now();
	expect(exit, `exited within 8 s of the answer:\n${app.output()}`).toEqual({
		code: 0,
		signal: null
	});
	// Promptly: not after Node's 5 s keep-alive timeout, nor the pool's 10 s idle timeout.
	expect(exitAt - response.at).toBeLessThan(2_000);
	const lines = app
		.output()
		.split('\n')
		.filter((l) => l.startsWith('{'))
		.map(
			(l) =>
				JSON.parse(l) as {
					kind: string;
					method?: string;
					status?: number;
					reason?: string;
					pools?: string;
				}
		);
	const patchLog = lines.findIndex(
		(l) => l.kind === 'request' && l.method === 'PATCH' && l.status === 200
	);
	const shutdownLog = lines.findIndex((l) => l.kind === 'shutdown');
	expect(patchLog).toBeGreaterThanOrEqual(0);
	expect(lines[shutdownLog]).toMatchObject({ reason: 'SIGTERM', pools: 'closed' });
	expect(shutdownLog, 'the pools closed after the request finished').toBeGreaterThan(patchLog);

	// The write is in the database.
	const stored = execFileSync(
		'mariadb',
		[
			'--no-defaults',
			`--socket=${join(process.env.SLOTWISE_DATA_DIR ?? join(ROOT, '.data'), 'mariadb.sock')}`,
			'-uroot',
			'--default-character-set=utf8mb4',
			'-N',
			'-B',
			database,
			'-e',
			`SELECT title FROM builds WHERE id = ${id}`
		],
		{ encoding: 'utf8' }
	).trim();
	expect(stored).toBe(title);

	writeReliabilitySection('shutdown', [
		runNote(),
		'',
		'| what | figure |',
		'| --- | ---: |',
		'| request in flight at SIGTERM (PATCH of a build, body held back by the client) | completed, **200**, saved |',
		`| SIGTERM → the request's answer (1.0 s of it the client's own wait) | ${((response.at - termAt) / 1000).toFixed(1)} s |`,
		`| the answer → process exit | ${((exitAt - response.at) / 1000).toFixed(2)} s |`,
		'| new connections after SIGTERM | refused |',
		"| the answer's `Connection` header (its connection was kept alive) | `close` |",
		'| shutdown log line | `pools: "closed"`, after the request\'s own log line |',
		'| exit code | **0** |'
	]);
});

test('SIGTERM while many requests are in flight and their clients have gone: the app still exits with 0', async () => {
	// What a load balancer's health check or a deploy sees when it stops a busy process:
	// clients that gave up mid-request. Node's server counts a connection its client closed
	// as gone, so `sveltekit:shutdown` can come while those requests still run on the server;
	// the pools must not close under them, and the process must still end.
	const app = await startApp({ DB_NAME: process.env.DB_NAME ?? 'slotwise_e2e', LOG_LEVEL: 'info' });
	const reader = await signIn(app.origin, 'reader@slotwise.test');
	const gone = new AbortController();
	const inFlight = [
		// Password checks (argon2, the slowest request there is) for an account that is not
		// rate limited by this test's own sign-in, fork writes and guide reads.
		...Array.from({ length: 8 }, () =>
			fetch(`${app.origin}/signin?/password`, {
				method: 'POST',
				signal: gone.signal,
				headers: {
					origin: app.origin,
					accept: 'text/html',
					'content-type': 'application/x-www-form-urlencoded'
				},
				body: new URLSearchParams({
					email: 'tobias.wren@slotwise.test',
					password: 'wrong-password-1'
				})
			})
		),
		...Array.from({ length: 8 }, () =>
			fetch(`${app.origin}/api/v1/guides/steady-1080p-starter/fork`, {
				method: 'POST',
				signal: gone.signal,
				headers: { cookie: reader, origin: app.origin, 'content-type': 'application/json' },
				body: '{}'
			})
		),
		...Array.from({ length: 16 }, (_, i) =>
			fetch(`${app.origin}/guides/steady-1080p-starter?region=${['de', 'jp', 'us', 'gb'][i % 4]}`, {
				signal: gone.signal,
				headers: { cookie: reader }
			})
		)
	].map((p) => p.catch(() => null));
	await sleep(30);
	gone.abort();
	app.child.kill('SIGTERM');
	await Promise.all(inFlight);

	const exit = await Promise.race([app.exited, sleep(20_000).then(() => null)]);
	if (exit === null) app.child.kill('SIGKILL');
	expect(exit, `exited within 20 s of SIGTERM:\n${app.output().slice(-3_000)}`).toEqual({
		code: 0,
		signal: null
	});
	const shutdown = app
		.output()
		.split('\n')
		.filter((l) => l.startsWith('{'))
		.map((l) => JSON.parse(l) as { kind: string; pools?: string })
		.find((l) => l.kind === 'shutdown');
	expect(shutdown).toMatchObject({ pools: 'closed' });
	// No request ran on after its pools had closed.
	expect(app.output()).not.toContain('connection manager was closed');
	expect(app.output()).not.toContain('Pool is closed');
});
