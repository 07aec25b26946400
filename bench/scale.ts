/*
 * Benchmark (not a test): do pages cost the same with 10 guides or 10,000? (issue 14)
 *
 * 1. A scratch database of its own (recreated, migrated, seeded with the demo community).
 * 2. The page benchmarks at demo size: for each page, the production server (`node build`)
 *    against a bare node:http server in its own process sending that page's exact bytes, in
 *    alternating warmed-up and drained rounds (bench/lib/harness.ts); the app's resident
 *    memory sampled throughout.
 * 3. The community grown to the issue's size (bench/lib/scale-data.ts: 10,000 published
 *    guides with revisions and alternates, 100,000 parts, 1,000,000 quotes, 100,000 builds;
 *    batched multi-row INSERTs), then the stored guide prices filled by the product's own
 *    batched refresh (services/guide-prices.ts refreshAll). The catalog's stored price keys
 *    (part_region_prices) fill as the quotes go in, by the database's own triggers (about
 *    65 µs per active quote on the development machine, so generating takes longer).
 * 4. The same page benchmarks again at that size, against a fresh app process.
 * 5. The table, with the machine and date and which targets are met, into docs/benchmarks.md.
 *
 * Run: npm run bench:scale (after `npx vite build`; MariaDB from scripts/db.sh, DB_PORT as
 * for the other scripts). Options (env): SCALE (1 = the issue's size; 0.1 = a tenth, to try
 * it quickly), BENCH_ROUNDS (2), BENCH_SECONDS (minimum timed window, 5), BENCH_CONNECTIONS
 * (50), BENCH_WRITE=0 to leave docs/benchmarks.md alone, BENCH_GENERATE_ONLY=1 to build the
 * scratch database only (to read EXPLAIN against it) and measure nothing, BENCH_REUSE=1 to
 * measure the database such a run left (same SCALE; waits for it to finish) instead of
 * growing a new one; then the grown size is measured before the demo size.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { Sequelize } from 'sequelize';
import {
	ROOT,
	compare,
	machineNotes,
	rssSampler,
	singleRequestMs,
	startApp,
	startBare,
	writeBenchSection,
	signInAsReader
} from './lib/harness';
import type { SideFigures } from './lib/harness';
import { countsAt, generate } from './lib/scale-data';

const SCALE = Number(process.env.SCALE ?? 1);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 2);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
/** The demo community alone, and the demo community grown to SCALE. */
const DEMO_DB = 'slotwise_bench_scale_demo';
const SCALE_DB = 'slotwise_bench_scale';
const TIMING_FILE = resolve(ROOT, '.data/bench-scale-timing.json');
const DB_PORT =
	process.env.DB_PORT ??
	(existsSync(resolve(ROOT, '.data/db.port'))
		? readFileSync(resolve(ROOT, '.data/db.port'), 'utf8').trim()
		: '3307');
const SLUG = 'steady-1080p-starter';

type Kind = 'list' | 'anonymous guide' | 'signed-in guide' | 'pricing' | 'other';
interface Page {
	name: string;
	path: string;
	kind: Kind;
	signedIn?: boolean;
}
const PAGES: Page[] = [
	{ name: 'home', path: '/', kind: 'list' },
	{ name: '/guides, newest', path: '/guides', kind: 'list' },
	{ name: '/guides, lowest total in JP', path: '/guides?region=jp&sort=total', kind: 'list' },
	{ name: '/guides, best value in DE', path: '/guides?region=de&sort=value', kind: 'list' },
	// Not a target of the issue either (search is new): one request at a time only.
	{ name: '/guides, words "quiet tower"', path: '/guides?q=quiet+tower', kind: 'other' },
	{ name: 'GET /api/v1/guides', path: '/api/v1/guides', kind: 'list' },
	{ name: 'parts search "strata"', path: '/parts?q=strata', kind: 'list' },
	// Not a target of the issue: measured one request at a time only.
	{ name: 'parts by price in DE', path: '/parts?region=de&sort=price', kind: 'other' },
	{ name: 'guide page, anonymous', path: `/guides/${SLUG}`, kind: 'anonymous guide' },
	{
		name: 'guide page, signed in',
		path: `/guides/${SLUG}`,
		kind: 'signed-in guide',
		signedIn: true
	},
	{ name: 'pricing API in JP', path: `/api/v1/guides/${SLUG}/pricing?region=jp`, kind: 'pricing' }
];
/** The least app/bare ratio each kind must reach (issue 14's targets). */
const MIN_RATIO: Record<Kind, number | null> = {
	list: 0.25,
	'anonymous guide': 0.5,
	'signed-in guide': 0.1,
	pricing: 0.25,
	other: null
};

interface Measured {
	page: Page;
	app: SideFigures;
	bare: SideFigures;
	ratio: number;
	bytes: number;
}

function prepareDatabase(name: string): void {
	console.log(`[scale] preparing ${name} (fresh, migrated, seeded) on port ${DB_PORT}`);
	const env = { ...process.env, DB_PORT, DB_NAMES: name, DB_NAME: name };
	const sh = (args: string[]) => execFileSync('bash', args, { cwd: ROOT, env, stdio: 'pipe' });
	sh(['scripts/db.sh', 'start']);
	sh(['scripts/db.sh', 'recreate', name]);
	for (const step of ['migrate', 'seed'])
		execFileSync('npx', ['tsx', `scripts/${step}.ts`, 'up'], { cwd: ROOT, env, stdio: 'pipe' });
}

/** Every page against its bare twin on one app process; the app's peak memory. */
async function measureAll(
	label: string,
	dbName: string
): Promise<{ rows: Measured[]; peakMb: number }> {
	const app = await startApp({ DB_NAME: dbName, DB_PORT });
	const memory = rssSampler(app.process.pid ?? 0);
	const rows: Measured[] = [];
	let peakMb: number;
	try {
		const cookie = await signInAsReader(app.origin);
		for (const page of PAGES) rows.push(await measurePage(app.origin, page, cookie, label));
	} catch (err) {
		console.error(app.errors());
		throw err;
	} finally {
		peakMb = memory.stop().maxMb;
		await app.stop();
	}
	console.log(`[${label}] app peak resident memory ${peakMb.toFixed(0)} MB`);
	return { rows, peakMb };
}

async function measurePage(
	origin: string,
	page: Page,
	cookie: string,
	label: string
): Promise<Measured> {
	const url = `${origin}${page.path}`;
	const headers: Record<string, string> = page.signedIn ? { cookie } : {};
	const first = await fetch(url, { headers });
	if (first.status !== 200) throw new Error(`${page.path} answered ${first.status}`);
	const body = Buffer.from(await first.arrayBuffer());
	if (page.kind === 'other') {
		// No target: one request at a time only, so a slow page cannot stretch the run.
		const singleMs = await singleRequestMs({ url, headers });
		console.log(`[${label}] ${page.name}: one request ${singleMs.toFixed(1)} ms`);
		const none: SideFigures = {
			rps: NaN,
			singleMs,
			p50: NaN,
			p99: NaN,
			requests: 0,
			errors: 0,
			non2xx: 0,
			seconds: 0
		};
		return { page, app: none, bare: none, ratio: NaN, bytes: body.length };
	}
	const bare = await startBare(body, first.headers.get('content-type') ?? 'text/html');
	try {
		const result = await compare({
			app: { url, headers },
			bare: { url: bare.url },
			idleUrl: `${origin}/api/health`,
			rounds: ROUNDS,
			connections: CONNECTIONS,
			minSeconds: SECONDS
		});
		console.log(
			`[${label}] ${page.name}: ${result.app.rps.toFixed(0)} req/s vs bare ` +
				`${result.bare.rps.toFixed(0)} (ratio ${result.ratio.toFixed(3)}), one request ` +
				`${result.app.singleMs.toFixed(1)} ms, p99 ${result.app.p99} ms, ` +
				`errors ${result.app.errors}, non-2xx ${result.app.non2xx}`
		);
		return { page, ...result, bytes: body.length };
	} finally {
		bare.stop();
	}
}

interface Timing {
	scale: number;
	generateS: number;
	refreshS: number;
}

async function grow(): Promise<Timing> {
	const counts = countsAt(SCALE);
	console.log(`[scale] generating ${JSON.stringify(counts)}`);
	const started = performance.now();
	const sequelize = new Sequelize(
		SCALE_DB,
		process.env.DB_USER ?? 'slotwise',
		process.env.DB_PASSWORD ?? 'slotwise-dev',
		{
			host: process.env.DB_HOST ?? '127.0.0.1',
			port: Number(DB_PORT),
			dialect: 'mariadb',
			logging: false,
			timezone: '+00:00',
			// One connection, so the session settings of the generator hold for every insert.
			pool: { max: 1, min: 0, acquire: 60_000, idle: 10_000 }
		}
	);
	try {
		await generate(sequelize, counts, (line) => console.log(line));
	} finally {
		await sequelize.close();
	}
	const generateS = (performance.now() - started) / 1000;
	// The product's own batched refresh, as after a rates refresh; its modules read DB_NAME once.
	process.env.DB_NAME = SCALE_DB;
	process.env.DB_PORT = DB_PORT;
	const refreshStarted = performance.now();
	const guidePrices = await import('../src/lib/server/services/guide-prices');
	await guidePrices.refreshAll();
	const refreshS = (performance.now() - refreshStarted) / 1000;
	const db = await import('../src/lib/server/db');
	await db.sequelize.close();
	console.log(
		`[scale] generated in ${generateS.toFixed(0)} s, stored prices in ${refreshS.toFixed(0)} s`
	);
	const timing = { scale: SCALE, generateS, refreshS };
	writeFileSync(TIMING_FILE, JSON.stringify(timing));
	return timing;
}

/** The timings a BENCH_GENERATE_ONLY run at this SCALE wrote when it finished. */
async function grownTiming(): Promise<Timing> {
	for (;;) {
		const timing = existsSync(TIMING_FILE)
			? (JSON.parse(readFileSync(TIMING_FILE, 'utf8')) as Timing)
			: null;
		if (timing?.scale === SCALE) return timing;
		console.log(`[scale] waiting for ${SCALE_DB} to be grown at SCALE=${SCALE}`);
		await new Promise((r) => setTimeout(r, 15_000));
	}
}

const fmt = (n: number, digits = 0) => (Number.isNaN(n) ? '—' : n.toFixed(digits));
const kb = (bytes: number) => (bytes / 1024).toFixed(0);

function verdict(demo: Measured, big: Measured): string {
	const min = MIN_RATIO[big.page.kind];
	if (min === null)
		return `no target (one request ${fmt(big.app.singleMs / demo.app.singleMs, 1)} × demo)`;
	const misses: string[] = [];
	if (big.ratio < min) misses.push(`ratio < ${min}`);
	if (big.page.kind === 'list' && big.app.singleMs >= 50) misses.push('one request ≥ 50 ms');
	if (big.app.errors + big.app.non2xx > 0) misses.push('errors');
	if (demo.ratio / big.ratio > 1.5) misses.push('> 1.5 × demo cost');
	return misses.length === 0 ? 'met' : `**not met**: ${misses.join(', ')}`;
}

async function main(): Promise<void> {
	if (!existsSync(resolve(ROOT, 'build/index.js')))
		throw new Error('No build/: run `npx vite build` first.');
	const machine = machineNotes();
	const date = new Date().toISOString().slice(0, 16).replace('T', ' ');
	if (process.env.BENCH_GENERATE_ONLY === '1') {
		// Only the grown community, e.g. to read EXPLAIN against it or to measure it later.
		prepareDatabase(SCALE_DB);
		await grow();
		return;
	}
	prepareDatabase(DEMO_DB);
	let demo: { rows: Measured[]; peakMb: number };
	let big: { rows: Measured[]; peakMb: number };
	let timing: Timing;
	if (process.env.BENCH_REUSE === '1') {
		// The grown community a BENCH_GENERATE_ONLY run leaves (waiting for it to finish, so
		// its inserts and refresh never run beside a measurement), then the demo size.
		timing = await grownTiming();
		big = await measureAll(`scale ${SCALE}`, SCALE_DB);
		demo = await measureAll('demo', DEMO_DB);
	} else {
		demo = await measureAll('demo', DEMO_DB);
		prepareDatabase(SCALE_DB);
		timing = await grow();
		big = await measureAll(`scale ${SCALE}`, SCALE_DB);
	}
	const counts = countsAt(SCALE);

	const rows = PAGES.map((page, i) => {
		const d = demo.rows[i]!;
		const b = big.rows[i]!;
		return (
			`| ${page.name} | ${fmt(d.app.rps)} / ${fmt(d.bare.rps)} = ${fmt(d.ratio, 3)} | ` +
			`${fmt(d.app.singleMs, 1)} | ${fmt(b.app.rps)} / ${fmt(b.bare.rps)} = ${fmt(b.ratio, 3)} | ` +
			`${fmt(b.app.singleMs, 1)} | ${fmt(b.app.p99)} | ${b.app.errors} / ${b.app.non2xx} | ` +
			`${fmt(d.ratio / b.ratio, 2)} | ${fmt(d.app.rps / b.app.rps, 2)} (${kb(d.bytes)} → ${kb(b.bytes)} KB) | ` +
			`${verdict(d, b)} |`
		);
	});
	const peakOk = big.peakMb < 400;
	const lines = [
		'## Pages at a real community’s size (`npm run bench:scale`)',
		'',
		`Run ${date} UTC on ${machine}. SCALE=${SCALE}: on top of the demo community, ` +
			`${counts.guides} published guides (two revisions each, 8 slots, 2 alternates per slot), ` +
			`${counts.parts} parts, ${counts.quotes} quotes, ${counts.builds} builds; generated in ` +
			`${fmt(timing.generateS)} s, stored guide prices filled by the product's refresh in ` +
			`${fmt(timing.refreshS)} s.`,
		'',
		`Each page from \`node build\` against a bare \`node:http\` server in its own process sending the page's`,
		`exact bytes; autocannon on loopback, ${CONNECTIONS} connections, ${ROUNDS} alternating rounds per side, each`,
		`warmed up 3 s, drained, then timed for at least ${SECONDS} s and 5 × the warm-up p99; req/s are means`,
		'over rounds. "One request" is the median of 9 requests with no other load. Growth is the demo ratio ÷',
		'the scale ratio: the cost of a page against a bare server sending the same bytes (the issue asks ≤ 1.5).',
		'Raw requests per second are shown beside it with the page sizes: home and /guides hold more guides at',
		'scale (up to their caps), so they send more bytes, and a bare server slows just as much for those bytes.',
		'Targets: lists one request < 50 ms and ratio ≥ 0.25; anonymous guide page ≥ 0.5; signed in ≥ 0.1;',
		'pricing API ≥ 0.25; 0 errors; resident memory < 400 MB.',
		'',
		'| page | demo: app / bare req/s = ratio | demo one request (ms) | scale: app / bare req/s = ratio | scale one request (ms) | scale p99 (ms) | scale errors / non-2xx | growth | req/s demo ÷ scale (page size) | targets at scale |',
		'| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | --- |',
		...rows,
		'',
		`App peak resident memory: ${fmt(demo.peakMb)} MB at demo size, ${fmt(big.peakMb)} MB at scale ` +
			`(${peakOk ? 'under' : '**over**'} 400 MB).`
	];
	console.log(lines.join('\n'));
	if (process.env.BENCH_WRITE !== '0')
		console.log(`written: ${writeBenchSection(`scale-${SCALE}`, lines)}`);
}

main().catch((err: unknown) => {
	console.error(err);
	process.exit(1);
});
