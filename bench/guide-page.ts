/*
 * Benchmark (not a test): the production server on a seeded guide page against a bare
 * node:http server that returns the very same HTML bytes, both under autocannon on
 * loopback with 50 connections. The ratio app/bare says how much of the ceiling the app's
 * own work (routing, auth hook, DB queries, pricing, rendering) costs on this machine.
 *
 * Run: npm run bench:guide-page, after `vite build`, against a migrated and seeded DB:
 *   DB_NAME=slotwise_bench AUTH_SECRET=... npm run bench:guide-page
 * Options (env): BENCH_SLUG (default steady-1080p-starter), BENCH_SECONDS (10),
 * BENCH_CONNECTIONS (50), BENCH_PORT (4390), BARE_PORT (4391), BENCH_WRITE=0 to skip
 * writing docs/benchmarks.md.
 */
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readFileSync, writeFileSync, existsSync, mkdirSync } from 'node:fs';
import { createServer } from 'node:http';
import { cpus, loadavg, release, totalmem, type as osType } from 'node:os';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';

interface Histogram {
	average: number;
	p50: number;
	p99: number;
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

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const SLUG = process.env.BENCH_SLUG ?? 'steady-1080p-starter';
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const APP_PORT = Number(process.env.BENCH_PORT ?? 4390);
const BARE_PORT = Number(process.env.BARE_PORT ?? 4391);
const HOST = '127.0.0.1'; // loopback only: nothing leaves the machine
const DB_NAME = process.env.DB_NAME ?? 'slotwise_bench';

async function waitForHealth(url: string, timeoutMs: number): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			if ((await fetch(url)).status === 200) return;
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`${url} did not answer 200 within ${timeoutMs} ms`);
}

async function load(url: string): Promise<CannonResult> {
	const run = autocannon as unknown as Cannon;
	// A short warm-up first (JIT, DB pool, caches), not counted. A request slower than 30 s
	// counts as a timeout (autocannon's default of 10 s is too tight on a loaded machine).
	await run({ url, connections: CONNECTIONS, duration: 2, timeout: 30 });
	return run({ url, connections: CONNECTIONS, duration: SECONDS, timeout: 30 });
}

function machineNotes(): string {
	const cpu = cpus();
	return [
		`${cpu.length} × ${cpu[0]?.model ?? 'unknown CPU'}`,
		`${Math.round(totalmem() / 2 ** 30)} GiB RAM`,
		`${osType()} ${release()}`,
		`Node ${process.version}`,
		// Other work on a shared machine skews both figures; the ratio less so.
		`load average at start ${loadavg()
			.map((n) => n.toFixed(1))
			.join(' / ')} (1/5/15 min)`,
		'MariaDB on the same machine (127.0.0.1:3307)',
		'autocannon and both servers share the machine (the bare server ran first, then the app)'
	].join('; ');
}

function row(name: string, r: CannonResult): string {
	return `| ${name} | ${r.requests.average.toFixed(0)} | ${r.latency.p50} | ${r.latency.p99} | ${r.requests.total} | ${r.errors + r.timeouts} | ${r.non2xx} |`;
}

const MARK_START = '<!-- bench:guide-page:start -->';
const MARK_END = '<!-- bench:guide-page:end -->';

function writeDocs(app: CannonResult, bare: CannonResult, htmlBytes: number): string {
	const ratio = app.requests.average / bare.requests.average;
	const section = [
		MARK_START,
		'## Guide page: production server vs a bare HTTP server (`npm run bench:guide-page`)',
		'',
		`Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineNotes()}.`,
		'',
		`Page \`/guides/${SLUG}\` (${htmlBytes} bytes of HTML) from \`node build\` on a seeded database, and`,
		'the same bytes from a bare `node:http` server; autocannon on loopback, ' +
			`${CONNECTIONS} connections, ${SECONDS} s each after a 2 s warm-up, one after the other;`,
		'"errors" counts connection errors and requests over 30 s.',
		'',
		'| server | requests/s (mean) | p50 latency (ms) | p99 latency (ms) | requests | errors | non-2xx |',
		'| --- | ---: | ---: | ---: | ---: | ---: | ---: |',
		row('app (node build)', app),
		row('bare node:http, same bytes', bare),
		'',
		`Ratio app/bare: **${ratio.toFixed(3)}** (${(ratio * 100).toFixed(1)} % of the bare ceiling).`,
		'',
		'The bare server is the ceiling for this machine and this payload; the gap is the work',
		"the app does per request (hooks, session check, the guide's DB queries, region pricing,",
		'server rendering). Figures vary with the machine and its load; compare ratios, not',
		'absolute numbers, across machines.',
		MARK_END
	].join('\n');
	const file = resolve(ROOT, 'docs/benchmarks.md');
	mkdirSync(dirname(file), { recursive: true });
	const current = existsSync(file)
		? readFileSync(file, 'utf8')
		: '# Benchmarks\n\nFigures from the scripts under `bench/`.\n';
	const start = current.indexOf(MARK_START);
	const end = current.indexOf(MARK_END);
	const next =
		start >= 0 && end > start
			? current.slice(0, start) + section + current.slice(end + MARK_END.length)
			: `${current.trimEnd()}\n\n${section}\n`;
	writeFileSync(file, next);
	return file;
}

async function main(): Promise<void> {
	if (!existsSync(resolve(ROOT, 'build/index.js')))
		throw new Error('No build/: run `npx vite build` first.');
	const origin = `http://${HOST}:${APP_PORT}`;
	const app = spawn(process.execPath, ['build'], {
		cwd: ROOT,
		// stderr is kept and shown only when the run fails: requests still queued when the
		// server stops log pool errors that say nothing about the figures.
		stdio: ['ignore', 'ignore', 'pipe'],
		env: {
			...process.env,
			PORT: String(APP_PORT),
			HOST,
			ORIGIN: origin,
			DB_NAME,
			LOG_LEVEL: 'silent',
			// A throwaway secret when none is given: the bench never signs anyone in.
			AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString('hex')
		}
	});
	let appErrors = '';
	app.stderr?.on('data', (chunk: Buffer) => {
		appErrors = (appErrors + chunk.toString()).slice(-20_000);
	});
	const bare = createServer();
	let ok = false;
	try {
		await waitForHealth(`${origin}/api/health`, 60_000);
		const pageUrl = `${origin}/guides/${SLUG}`;
		const first = await fetch(pageUrl);
		if (first.status !== 200)
			throw new Error(`${pageUrl} answered ${first.status}; is the DB seeded?`);
		const html = Buffer.from(await first.arrayBuffer());
		const contentType = first.headers.get('content-type') ?? 'text/html';

		bare.on('request', (_req, res) => {
			res.writeHead(200, { 'content-type': contentType, 'content-length': html.length });
			res.end(html);
		});
		await new Promise<void>((r) => bare.listen(BARE_PORT, HOST, r));

		// Bare first: a loaded app keeps working through its queue after autocannon stops,
		// which would steal CPU from a bare run that came second.
		console.log(`bare: http://${HOST}:${BARE_PORT}/ (${html.length} bytes)`);
		const bareResult = await load(`http://${HOST}:${BARE_PORT}/`);
		console.log(`app:  ${pageUrl}`);
		const appResult = await load(pageUrl);
		// Let the app drain its queue before it is stopped.
		await waitForHealth(`${origin}/api/health`, 60_000);

		console.log('| server | req/s | p50 ms | p99 ms | requests | errors | non-2xx |');
		console.log(row('app', appResult));
		console.log(row('bare', bareResult));
		console.log(
			`ratio app/bare: ${(appResult.requests.average / bareResult.requests.average).toFixed(3)}`
		);
		if (process.env.BENCH_WRITE !== '0')
			console.log(`written: ${writeDocs(appResult, bareResult, html.length)}`);
		ok = true;
	} finally {
		if (!ok && appErrors) console.error(appErrors);
		bare.close();
		app.kill('SIGTERM');
	}
}

main().catch((err: unknown) => {
	console.error(err);
	process.exit(1);
});
