/*
 * What every HTTP benchmark under bench/ shares, so each one measures the same honest way:
 *
 * - The baseline (a bare node:http server sending the page's exact bytes) runs in its OWN
 *   process, never inside the load generator's.
 * - Each round warms up first, then waits until the server is idle again (the warm-up's
 *   queued requests would otherwise spill into the timed window), then times a window at
 *   least a few times longer than the slowest warm-up request (the p99).
 * - Baseline and app alternate round by round and figures are the mean over rounds, so a
 *   burst of other work on a shared machine falls on both sides.
 * - The server's resident memory is sampled from /proc through the whole run.
 *
 * Benchmarks are never tests: they print figures and ratios and rewrite their section of
 * docs/benchmarks.md between markers.
 */
import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { cpus, loadavg, release, tmpdir, totalmem, type as osType } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const HOST = '127.0.0.1'; // loopback only: nothing leaves the machine

interface Histogram {
	average: number;
	p50: number;
	p99: number;
	max?: number;
}
interface CannonResult {
	requests: Histogram & { total: number };
	latency: Histogram;
	errors: number;
	timeouts: number;
	non2xx: number;
	duration: number;
}
type Cannon = (opts: Record<string, unknown>) => Promise<CannonResult>;
const cannon = autocannon as unknown as Cannon;

/** A request the load generator repeats. */
export interface Target {
	url: string;
	method?: 'GET' | 'POST';
	headers?: Record<string, string>;
	body?: string;
}

/** One side's figures over all rounds. */
export interface SideFigures {
	/** Mean of the rounds' mean requests per second. */
	rps: number;
	/** Median latency of a single request with no other load (ms). */
	singleMs: number;
	p50: number;
	/** Worst p99 of any round (ms). */
	p99: number;
	requests: number;
	errors: number;
	non2xx: number;
	seconds: number;
}

export function freePort(): Promise<number> {
	return new Promise((done, fail) => {
		const server = createServer();
		server.once('error', fail);
		server.listen(0, HOST, () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => done(port));
		});
	});
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function waitFor200(url: string, timeoutMs: number): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			if ((await fetch(url, { signal: AbortSignal.timeout(5_000) })).status === 200) return;
		} catch {
			// not answering yet
		}
		await sleep(200);
	}
	throw new Error(`${url} did not answer 200 within ${timeoutMs} ms`);
}

/** Median wall time of `n` single requests one after another (ms). */
export async function singleRequestMs(target: Target, n = 9): Promise<number> {
	const times: number[] = [];
	for (let i = 0; i < n; i++) {
		const start = performance.now();
		const response = await fetch(target.url, {
			method: target.method ?? 'GET',
			headers: target.headers,
			body: target.body
		});
		await response.arrayBuffer();
		times.push(performance.now() - start);
	}
	times.sort((a, b) => a - b);
	return times[Math.floor(times.length / 2)] ?? 0;
}

/**
 * Waits until the server behind `idleUrl` answers quickly twice in a row: whatever the
 * last load left queued has been worked off.
 */
export async function drain(idleUrl: string, quickMs = 100, timeoutMs = 120_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	let quick = 0;
	while (Date.now() < until && quick < 2) {
		const start = performance.now();
		try {
			await (await fetch(idleUrl, { signal: AbortSignal.timeout(30_000) })).arrayBuffer();
			quick = performance.now() - start < quickMs ? quick + 1 : 0;
		} catch {
			quick = 0;
		}
		if (quick < 2) await sleep(100);
	}
}

function cannonOptions(target: Target, connections: number, seconds: number) {
	return {
		url: target.url,
		method: target.method ?? 'GET',
		headers: target.headers,
		body: target.body,
		connections,
		duration: seconds,
		// A request slower than 30 s counts as a timeout.
		timeout: 30
	};
}

/** One warmed-up, drained, timed window against `target`. */
async function round(
	target: Target,
	idleUrl: string,
	connections: number,
	minSeconds: number
): Promise<CannonResult & { seconds: number }> {
	const warm = await cannon(cannonOptions(target, connections, 3));
	await drain(idleUrl);
	// The timed window is several times the slowest warm-up request, so the p99 is measured
	// inside it rather than cut off at its edge.
	const seconds = Math.max(minSeconds, Math.ceil((warm.latency.p99 * 5) / 1000));
	const result = await cannon(cannonOptions(target, connections, seconds));
	await drain(idleUrl);
	return { ...result, seconds };
}

function summarise(results: (CannonResult & { seconds: number })[], singleMs: number): SideFigures {
	const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);
	return {
		rps: mean(results.map((r) => r.requests.average)),
		singleMs,
		p50: mean(results.map((r) => r.latency.p50)),
		p99: Math.max(...results.map((r) => r.latency.p99)),
		requests: results.reduce((a, r) => a + r.requests.total, 0),
		errors: results.reduce((a, r) => a + r.errors + r.timeouts, 0),
		non2xx: results.reduce((a, r) => a + r.non2xx, 0),
		seconds: results.reduce((a, r) => a + r.seconds, 0)
	};
}

/** A bare server in its own process answering with `body`. */
export async function startBare(
	body: Buffer,
	contentType: string
): Promise<{ url: string; stop: () => void }> {
	const dir = mkdtempSync(join(tmpdir(), 'slotwise-bare-'));
	const file = join(dir, 'body');
	writeFileSync(file, body);
	const child = spawn(process.execPath, [resolve(ROOT, 'bench/lib/bare-server.mjs')], {
		env: { ...process.env, BARE_FILE: file, BARE_TYPE: contentType },
		stdio: ['ignore', 'pipe', 'inherit']
	});
	const port = await new Promise<number>((done, fail) => {
		let out = '';
		child.stdout?.on('data', (chunk: Buffer) => {
			out += chunk.toString();
			const match = /listening (\d+)/.exec(out);
			if (match) done(Number(match[1]));
		});
		child.once('exit', (code) => fail(new Error(`bare server exited with ${code}`)));
	});
	return { url: `http://${HOST}:${port}/`, stop: () => child.kill('SIGTERM') };
}

/** The production build (`node build`) on a free port against `dbName`. */
export async function startApp(env: Record<string, string>): Promise<{
	origin: string;
	process: ChildProcess;
	stop: () => Promise<void>;
	errors: () => string;
}> {
	if (!existsSync(resolve(ROOT, 'build/index.js')))
		throw new Error('No build/: run `npx vite build` first.');
	const port = await freePort();
	const origin = `http://${HOST}:${port}`;
	// The heap ceiling of scripts/lib.sh (APP_HEAP_FLAG), as `npm start` and `npm run serve` run it.
	const child = spawn(process.execPath, ['--max-old-space-size=384', 'build'], {
		cwd: ROOT,
		stdio: ['ignore', 'ignore', 'pipe'],
		env: {
			...process.env,
			PORT: String(port),
			HOST,
			ORIGIN: origin,
			LOG_LEVEL: process.env.APP_LOG_LEVEL ?? 'silent',
			// The pages are measured, not the daily upkeep pass: in a fresh scratch database the
			// scheduler's first tick would run that pass (minutes at 10,000 guides) inside the
			// timed windows. Its cost is measured on its own (bench:scale, "stored guide prices").
			SCHEDULER: 'off',
			// A throwaway secret when none is given.
			AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString('hex'),
			...env
		}
	});
	let stderr = '';
	child.stderr?.on('data', (chunk: Buffer) => {
		stderr = (stderr + chunk.toString()).slice(-20_000);
	});
	await waitFor200(`${origin}/api/health`, 60_000);
	return {
		origin,
		process: child,
		errors: () => stderr,
		// SIGTERM, as a service manager stops it. An app that has not exited 40 s later (its
		// shutdown is stuck) is killed and the run fails with its log, rather than hang.
		stop: () =>
			new Promise((done, fail) => {
				const stuck = setTimeout(() => {
					child.kill('SIGKILL');
					fail(new Error(`the app did not exit within 40 s of SIGTERM:\n${stderr}`));
				}, 40_000);
				child.once('exit', () => {
					clearTimeout(stuck);
					done();
				});
				child.kill('SIGTERM');
			})
	};
}

/** Samples a process's resident memory (VmRSS) every 250 ms until stopped. */
export function rssSampler(pid: number): {
	stop: () => { maxMb: number; lastMb: number; samplesMb: number[] };
} {
	let maxKb = 0;
	let lastKb = 0;
	const samplesKb: number[] = [];
	const read = () => {
		try {
			const status = readFileSync(`/proc/${pid}/status`, 'utf8');
			const kb = Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0);
			lastKb = kb;
			maxKb = Math.max(maxKb, kb);
			samplesKb.push(kb);
		} catch {
			// the process is gone
		}
	};
	read();
	const timer = setInterval(read, 250);
	return {
		stop: () => {
			clearInterval(timer);
			read();
			return {
				maxMb: maxKb / 1024,
				lastMb: lastKb / 1024,
				samplesMb: samplesKb.map((kb) => kb / 1024)
			};
		}
	};
}

/**
 * App against its bare baseline: `rounds` alternating rounds (bare first each time), each
 * warmed up, drained and timed; figures are the mean over rounds.
 */
export async function compare(opts: {
	app: Target;
	bare: Target;
	/** A cheap URL of the app used to tell when it is idle again. */
	idleUrl: string;
	rounds?: number;
	connections?: number;
	minSeconds?: number;
}): Promise<{ app: SideFigures; bare: SideFigures; ratio: number }> {
	const rounds = opts.rounds ?? 3;
	const connections = opts.connections ?? 50;
	const minSeconds = opts.minSeconds ?? 10;
	const appSingle = await singleRequestMs(opts.app);
	const bareSingle = await singleRequestMs(opts.bare);
	const appRuns: (CannonResult & { seconds: number })[] = [];
	const bareRuns: (CannonResult & { seconds: number })[] = [];
	for (let i = 0; i < rounds; i++) {
		bareRuns.push(await round(opts.bare, opts.bare.url, connections, minSeconds));
		appRuns.push(await round(opts.app, opts.idleUrl, connections, minSeconds));
	}
	const app = summarise(appRuns, appSingle);
	const bare = summarise(bareRuns, bareSingle);
	return { app, bare, ratio: app.rps / bare.rps };
}

export function machineNotes(): string {
	const cpu = cpus();
	return [
		`${cpu.length} × ${cpu[0]?.model ?? 'unknown CPU'}`,
		`${Math.round(totalmem() / 2 ** 30)} GiB RAM`,
		`${osType()} ${release()}`,
		`Node ${process.version}`,
		// Other work on a shared machine skews both figures; the ratio less so.
		`load average at start ${loadavg()
			.map((n) => n.toFixed(1))
			.join(' / ')} (1/5/15 min)`
	].join('; ');
}

export function figuresRow(name: string, f: SideFigures): string {
	return `| ${name} | ${f.rps.toFixed(0)} | ${f.singleMs.toFixed(1)} | ${f.p50.toFixed(0)} | ${f.p99} | ${f.requests} | ${f.errors} | ${f.non2xx} |`;
}

export const FIGURES_HEADER = [
	'| server | requests/s (mean of rounds) | one request alone (ms, median) | p50 under load (ms) | p99 under load (ms, worst round) | requests | errors | non-2xx |',
	'| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: |'
];

/** Replaces the section between `<!-- bench:NAME:start -->` and its end marker in docs/benchmarks.md. */
export function writeBenchSection(name: string, lines: string[]): string {
	const start = `<!-- bench:${name}:start -->`;
	const end = `<!-- bench:${name}:end -->`;
	const section = [start, ...lines, end].join('\n');
	const file = resolve(ROOT, 'docs/benchmarks.md');
	mkdirSync(dirname(file), { recursive: true });
	const current = existsSync(file)
		? readFileSync(file, 'utf8')
		: '# Benchmarks\n\nFigures from the scripts under `bench/`.\n';
	const from = current.indexOf(start);
	const to = current.indexOf(end);
	const next =
		from >= 0 && to > from
			? current.slice(0, from) + section + current.slice(to + end.length)
			: `${current.trimEnd()}\n\n${section}\n`;
	writeFileSync(file, next);
	return file;
}

/** The demo reader both the load and the scale benchmarks sign in as. */
export const DEMO_READER = 'reader@slotwise.test';
export const DEMO_PASSWORD = 'slotwise-demo-password';

/** Signs a demo account in through the real form; the session cookie for later requests. */
export async function signInAs(origin: string, email: string): Promise<string> {
	const response = await fetch(`${origin}/signin?/password`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded'
		},
		body: new URLSearchParams({ email, password: DEMO_PASSWORD })
	});
	if (response.status !== 303) throw new Error(`sign-in of ${email} answered ${response.status}`);
	return response.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.filter((c) => c?.startsWith('authjs.session-token'))
		.join('; ');
}

/** Signs the demo reader in. */
export function signInAsReader(origin: string): Promise<string> {
	return signInAs(origin, DEMO_READER);
}
