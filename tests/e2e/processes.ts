/*
 * Real processes for the tests that need more than the one app npm test starts: scratch
 * MariaDB instances (their own datadir under the system temp folder and a free port, started
 * by the project's own scripts/db.sh and scripts/db-replica.sh), migrated and seeded with the
 * project's scripts, and `node build` processes on free ports. HTTP helpers sign in and post
 * forms the way a browser does.
 */
import { execFile, execFileSync, spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { DEMO_PASSWORD, freePort } from './support';

export const ROOT = resolve(import.meta.dirname, '../..');

const sleep = (ms: number) => new Promise((done) => setTimeout(done, ms));

/*
 * Everything a test file starts is registered here as soon as it exists, so cleanUp() in its
 * afterAll stops it even when a hook timed out half-way (before the test had a handle on it).
 */
const startedApps = new Set<AppProcess>();
const startedDbs = new Set<ScratchDb>();

/** Stops every app process and removes every scratch MariaDB this file started. */
export async function cleanUp(): Promise<void> {
	for (const app of startedApps) await app.stop();
	startedApps.clear();
	for (const db of startedDbs) db.remove();
	startedDbs.clear();
}

/** A project-local MariaDB of its own, driven by the same scripts as the checkout's. */
export interface ScratchDb {
	port: number;
	dataDir: string;
	/** Environment for scripts/*.sh and the app pointing at this instance. */
	env: NodeJS.ProcessEnv;
	/** Runs SQL as root over the socket; rows as tab-split string arrays. */
	sql(query: string, database?: string): string[][];
	/** scripts/db.sh start (also after a crash: InnoDB recovers on start). */
	start(): void;
	/** The same without blocking this process's event loop (clients keep running meanwhile). */
	startInBackground(): Promise<void>;
	stop(): void;
	/** SIGKILL to mariadbd, as a power cut or OOM kill would; returns its pid. */
	kill9(): number;
	migrateAndSeed(database: string): void;
	/** Stops the instance (and its replica) and deletes the datadir. */
	remove(): void;
}

export async function scratchDb(label: string, databases: string[]): Promise<ScratchDb> {
	const dataDir = mkdtempSync(join(tmpdir(), `slotwise-${label}-`));
	const port = await freePort();
	const env: NodeJS.ProcessEnv = {
		...process.env,
		SLOTWISE_DATA_DIR: dataDir,
		DB_PORT: String(port),
		DB_NAMES: databases.join(' ')
	};
	const script = (name: string, ...args: string[]) =>
		execFileSync('bash', [join(ROOT, 'scripts', name), ...args], { env, stdio: 'pipe' });
	const sql = (query: string, database?: string) =>
		execFileSync(
			'mariadb',
			[
				'--no-defaults',
				`--socket=${join(dataDir, 'mariadb.sock')}`,
				'-uroot',
				'--default-character-set=utf8mb4',
				'-N',
				'-B',
				...(database ? [database] : []),
				'-e',
				query
			],
			{ encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 }
		)
			.split('\n')
			.filter((line) => line !== '')
			.map((line) => line.split('\t'));
	const db: ScratchDb = {
		port,
		dataDir,
		env,
		sql,
		start: () => void script('db.sh', 'start'),
		startInBackground: () =>
			new Promise<void>((done, fail) =>
				execFile('bash', [join(ROOT, 'scripts/db.sh'), 'start'], { env }, (error) =>
					error ? fail(error) : done()
				)
			),
		stop: () => void script('db.sh', 'stop'),
		kill9: () => {
			const pid = Number(readFileSync(join(dataDir, 'mariadb.pid'), 'utf8').trim());
			process.kill(pid, 'SIGKILL');
			return pid;
		},
		migrateAndSeed: (database) => {
			for (const step of ['migrate', 'seed'])
				execFileSync('npx', ['tsx', join(ROOT, `scripts/${step}.ts`), 'up'], {
					cwd: ROOT,
					env: { ...env, DB_NAME: database },
					stdio: 'pipe'
				});
		},
		remove: () => {
			startedDbs.delete(db);
			try {
				script('db-replica.sh', 'stop');
			} catch {
				// no replica
			}
			try {
				script('db.sh', 'stop');
			} finally {
				rmSync(dataDir, { recursive: true, force: true });
			}
		}
	};
	startedDbs.add(db);
	db.start();
	return db;
}

/** `node build` on a free port. */
export interface AppProcess {
	origin: string;
	child: ChildProcess;
	/** stdout and stderr so far. */
	output(): string;
	/** Resolves with the exit code (null when killed by a signal) and the signal. */
	exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
	/** SIGTERM and wait for the exit. */
	stop(): Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

export async function startApp(
	env: NodeJS.ProcessEnv,
	command: string[] = ['node', 'build']
): Promise<AppProcess> {
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const child = spawn(command[0]!, command.slice(1), {
		cwd: ROOT,
		env: {
			...process.env,
			LOG_LEVEL: 'silent',
			...env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: origin
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	const keep = (chunk: Buffer) => (output = (output + chunk.toString()).slice(-50_000));
	child.stdout?.on('data', keep);
	child.stderr?.on('data', keep);
	const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((done) =>
		child.once('exit', (code, signal) => done({ code, signal }))
	);
	const app: AppProcess = {
		origin,
		child,
		output: () => output,
		exited,
		stop: () => {
			startedApps.delete(app);
			if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
			return exited;
		}
	};
	startedApps.add(app);
	const until = Date.now() + 60_000;
	let exitedEarly = false;
	void exited.then(() => (exitedEarly = true));
	while (Date.now() < until && !exitedEarly) {
		try {
			const health = await fetch(`${origin}/api/health`, { signal: AbortSignal.timeout(2_000) });
			if (health.status === 200) return app;
		} catch {
			// not listening yet
		}
		await sleep(200);
	}
	await app.stop();
	throw new Error(`${command.join(' ')} did not become healthy on ${origin}:\n${output}`);
}

/** The cookies a response sets, as one Cookie header value (name=value; …). */
export function cookiesOf(response: Response, previous = ''): string {
	const jar = new Map<string, string>();
	for (const pair of previous.split('; ').filter(Boolean)) {
		const at = pair.indexOf('=');
		jar.set(pair.slice(0, at), pair.slice(at + 1));
	}
	for (const line of response.headers.getSetCookie()) {
		const [pair = ''] = line.split(';');
		const at = pair.indexOf('=');
		jar.set(pair.slice(0, at), pair.slice(at + 1));
	}
	return [...jar].map(([name, value]) => `${name}=${value}`).join('; ');
}

/**
 * Posts a form to a SvelteKit action as a browser without JavaScript does (same-origin
 * Origin header, HTML accepted), so the HTTP status is the action's own (303, 400, 429 …).
 */
export function postForm(
	origin: string,
	path: string,
	fields: Record<string, string>,
	cookie = ''
): Promise<Response> {
	return fetch(`${origin}${path}`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded',
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams(fields),
		signal: AbortSignal.timeout(20_000)
	});
}

/** Signs in through the password form; returns the Cookie header of the session. */
export async function signIn(
	origin: string,
	email: string,
	password = DEMO_PASSWORD
): Promise<string> {
	const response = await postForm(origin, '/signin?/password', { email, password });
	if (response.status !== 303)
		throw new Error(`sign-in of ${email} on ${origin} answered ${response.status}`);
	const cookie = cookiesOf(response);
	if (!cookie.includes('session-token'))
		throw new Error(`sign-in of ${email} set no session cookie`);
	return cookie;
}

/** A JSON request with a session cookie. */
export function api(
	origin: string,
	method: string,
	path: string,
	cookie: string,
	body?: unknown
): Promise<Response> {
	return fetch(`${origin}${path}`, {
		method,
		headers: {
			cookie,
			origin,
			accept: 'application/json',
			...(body === undefined ? {} : { 'content-type': 'application/json' })
		},
		body: body === undefined ? undefined : JSON.stringify(body),
		signal: AbortSignal.timeout(20_000)
	});
}
