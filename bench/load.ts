/*
 * Benchmark (not a test): a mixed workload for 60 s at 50 connections against one app
 * process, then against two app processes behind a reverse proxy (nginx when installed,
 * else a tiny Node round-robin; bench/lib/proxy.ts), on a fresh seeded database of its own.
 *
 * Each connection repeats one visit: a guide page, the guide list, a guide re-priced in a
 * region (JSON), a fit check (JSON), a fork (signed in), an edit of that fork, and a
 * password sign-in. Statuses are tallied per kind: every kind expects its 2xx (sign-in its
 * 303 redirect); 429s from sign-in are counted apart as expected, anything else is an
 * unexpected answer. Latency percentiles are autocannon's over all requests, and per kind
 * from this process's clock. Each app's resident memory is sampled through the timed
 * window: "flat" means the mean of its last quarter is within 10 % of its first quarter's.
 *
 * Run: npm run bench:load (after `vite build`; MariaDB running: npm run db:start).
 * Options (env): BENCH_SECONDS (60), BENCH_CONNECTIONS (50), BENCH_ROUNDS (1: one round of
 * each side, one process first), BENCH_PROXY=node (skip nginx), BENCH_WRITE=0.
 */
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import autocannon from 'autocannon';
import {
	ROOT,
	drain,
	freePort,
	machineNotes,
	rssSampler,
	startApp,
	writeBenchSection,
	DEMO_READER,
	DEMO_PASSWORD
} from './lib/harness';
import { addCrowd, signInCrowd } from './lib/crowd';
import { startProxy } from './lib/proxy';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 60);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 1);
/** Readers who fork and edit (see signInCrowd): enough that none reaches the fork limit. */
const CROWD = Number(process.env.BENCH_READERS ?? 600);
const WARM_UP_SECONDS = 5;
const DB_NAME = 'slotwise_bench_load';
const SLUGS = [
	'steady-1080p-starter',
	'balanced-1440p-am5',
	'quiet-4k-play-and-work',
	'pocket-itx-1440p'
];
const REGIONS = ['us', 'de', 'uk', 'jp'];

/** A seven-part build of invented parts on real standards (the shape of POST /api/v1/fit). */
const FIT_BODY = JSON.stringify({
	slots: [
		[
			'cpu',
			'cpu',
			{
				socket: 'AM5',
				cores: 8,
				threads: 16,
				baseClockGhz: 4.2,
				boostClockGhz: 5,
				tdpW: 105,
				memoryTypes: ['DDR5'],
				integratedGraphics: true,
				bundledCooler: false
			}
		],
		[
			'board',
			'motherboard',
			{
				socket: 'AM5',
				chipset: 'X-sample',
				formFactor: 'ATX',
				memoryType: 'DDR5',
				memorySlots: 4,
				maxMemoryGb: 192,
				m2Slots: [{ pcieGen: 4, maxLengthMm: 80 }],
				sataPorts: 4,
				wifi: true
			}
		],
		['cooler', 'cooler', { type: 'air', heightMm: 155, sockets: ['AM5'], ratedHeatW: 220 }],
		[
			'memory',
			'memory',
			{ type: 'DDR5', modules: 2, moduleGb: 16, speedMts: 6000, casLatency: 30, voltage: 1.35 }
		],
		[
			'gpu',
			'gpu',
			{
				chip: 'Sample 70',
				vramGb: 12,
				lengthMm: 336,
				slotWidth: 2.5,
				boardPowerW: 250,
				powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
				pcieGen: 4
			}
		],
		[
			'psu',
			'psu',
			{
				ratedW: 850,
				formFactor: 'ATX',
				efficiency: '80 PLUS Gold',
				modular: 'full',
				connectors: { pin6: 0, pin8: 4, h12v2x6: 1, eps8: 2 },
				atx3: true
			}
		],
		[
			'case',
			'case',
			{
				boardFormFactors: ['ATX'],
				maxGpuLengthMm: 360,
				maxCoolerHeightMm: 170,
				psuFormFactors: ['ATX'],
				radiatorMm: 360,
				includedFans: 3,
				fanMounts: 8,
				bays25: 2,
				bays35: 2
			}
		]
	].map(([key, category, specs]) => ({ key, category, brand: 'Sample', model: key, specs }))
});

interface Kind {
	name: string;
	expected: number;
}
const KINDS: Kind[] = [
	{ name: 'guide page', expected: 200 },
	{ name: 'guide list', expected: 200 },
	{ name: 're-price in a region (JSON)', expected: 200 },
	{ name: 'fit check (JSON)', expected: 200 },
	{ name: 'fork (signed in)', expected: 201 },
	{ name: 'edit the fork (signed in)', expected: 200 },
	{ name: 'password sign-in', expected: 303 }
];

interface Tally {
	statuses: Map<string, Map<number, number>>;
	latencies: Map<string, number[]>;
}
type Context = Record<string, number | undefined>;
type Req = { method?: string; path?: string; headers?: Record<string, string>; body?: string };

/** The visit every connection repeats; statuses and latencies go into `tally`. */
function visit(origin: string, sessions: readonly string[], tally: Tally) {
	const json = { 'content-type': 'application/json', accept: 'application/json', origin };
	const timed = (kind: string, setup?: (req: Req, ctx: Context) => Req) => ({
		setupRequest: (req: Req, ctx: Context) => {
			ctx[`t:${kind}`] = performance.now();
			return setup ? setup(req, ctx) : req;
		},
		onResponse: (status: number, body: string, ctx: Context) => {
			const counts = tally.statuses.get(kind) ?? new Map<number, number>();
			counts.set(status, (counts.get(status) ?? 0) + 1);
			tally.statuses.set(kind, counts);
			const started = ctx[`t:${kind}`];
			if (started !== undefined) tally.latencies.get(kind)?.push(performance.now() - started);
			after[kind]?.(status, body, ctx);
		}
	});
	const after: Record<string, (status: number, body: string, ctx: Context) => void> = {
		'fork (signed in)': (status, body, ctx) => {
			if (status === 201) {
				ctx.buildId = (JSON.parse(body) as { id: number }).id;
				ctx.version = 1;
			}
		},
		'edit the fork (signed in)': (status, body, ctx) => {
			if (status === 200) ctx.version = (JSON.parse(body) as { version: number }).version;
		}
	};
	const next = (ctx: Context) => (ctx.n = (ctx.n ?? 0) + 1);
	let nextReader = 0;
	return [
		{
			method: 'GET',
			path: '/',
			...timed('guide page', (req, ctx) => ({
				...req,
				path: `/guides/${SLUGS[next(ctx) % SLUGS.length]}`
			}))
		},
		{ method: 'GET', path: '/guides', ...timed('guide list') },
		{
			method: 'GET',
			path: '/',
			...timed('re-price in a region (JSON)', (req, ctx) => ({
				...req,
				path: `/api/v1/guides/${SLUGS[(ctx.n ?? 0) % SLUGS.length]}/pricing?region=${REGIONS[(ctx.n ?? 0) % REGIONS.length]}`
			}))
		},
		{
			method: 'POST',
			path: '/api/v1/fit',
			headers: json,
			body: FIT_BODY,
			...timed('fit check (JSON)')
		},
		{
			method: 'POST',
			path: `/api/v1/guides/${SLUGS[0]}/fork`,
			body: '{}',
			// The next reader of the crowd forks; the edit that follows is theirs too.
			...timed('fork (signed in)', (req, ctx) => {
				ctx.reader = nextReader++ % sessions.length;
				return { ...req, headers: { ...json, cookie: sessions[ctx.reader]! } };
			})
		},
		{
			method: 'PATCH',
			path: '/',
			...timed('edit the fork (signed in)', (req, ctx) => ({
				...req,
				headers: { ...json, cookie: sessions[ctx.reader ?? 0]! },
				path: `/api/v1/builds/${ctx.buildId ?? 0}`,
				body: JSON.stringify({ version: ctx.version ?? 1, title: `Load run edit ${ctx.n ?? 0}` })
			}))
		},
		{
			method: 'POST',
			path: '/signin?/password',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				accept: 'text/html',
				origin
			},
			body: new URLSearchParams({ email: DEMO_READER, password: DEMO_PASSWORD }).toString(),
			...timed('password sign-in')
		}
	];
}

interface CannonResult {
	requests: { average: number; total: number };
	latency: { p50: number; p99: number; max: number };
	errors: number;
	timeouts: number;
	duration: number;
}

async function run(
	origin: string,
	seconds: number,
	sessions: readonly string[]
): Promise<{ result: CannonResult; tally: Tally }> {
	const tally: Tally = {
		statuses: new Map(),
		latencies: new Map(KINDS.map((k) => [k.name, []]))
	};
	const result = (await (autocannon as unknown as (o: object) => Promise<CannonResult>)({
		url: origin,
		connections: CONNECTIONS,
		duration: seconds,
		timeout: 30,
		requests: visit(origin, sessions, tally)
	})) as CannonResult;
	return { result, tally };
}

/** CPU seconds (user + system) a process and its children have used so far, from /proc; 0 when gone. */
const TICKS_PER_SECOND =
	Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
function cpuSeconds(pid: number): number {
	return ownCpuSeconds(pid) + childrenOf(pid).reduce((sum, child) => sum + cpuSeconds(child), 0);
}
/** Child processes (nginx's workers do the proxying, not its master). */
function childrenOf(pid: number): number[] {
	try {
		return readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8')
			.split(' ')
			.filter(Boolean)
			.map(Number);
	} catch {
		return [];
	}
}
function ownCpuSeconds(pid: number): number {
	try {
		// The fields after the command name (which may hold spaces): utime and stime are 14 and 15.
		const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
		const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
		return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_SECOND;
	} catch {
		return 0;
	}
}

/** mariadbd of this checkout (scripts/db.sh writes its pid), for its share of the CPU. */
function mariadbPid(): number {
	try {
		return Number(readFileSync(resolve(ROOT, '.data/mariadb.pid'), 'utf8').trim());
	} catch {
		return 0;
	}
}

const percentile = (xs: number[], p: number) => {
	const sorted = [...xs].sort((a, b) => a - b);
	return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? 0;
};
const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);

function memoryLine(name: string, samples: number[]): { line: string; flat: boolean } {
	const quarter = Math.max(1, Math.floor(samples.length / 4));
	const first = mean(samples.slice(0, quarter));
	const last = mean(samples.slice(-quarter));
	const flat = last <= first * 1.1;
	return {
		flat,
		line: `| ${name} | ${first.toFixed(0)} | ${last.toFixed(0)} | ${Math.max(...samples).toFixed(0)} | ${flat ? 'flat' : '**grew**'} |`
	};
}

interface SideReport {
	label: string;
	result: CannonResult;
	tally: Tally;
	memory: { name: string; samples: number[] }[];
	/** CPU seconds used during the timed window, per process. */
	cpu: { name: string; seconds: number }[];
}

async function oneSide(processes: 1 | 2): Promise<SideReport> {
	const secret = process.env.AUTH_SECRET ?? randomBytes(32).toString('base64url');
	const proxyPort = processes === 2 ? await freePort() : 0;
	const behindProxy: Record<string, string> =
		processes === 2
			? {
					ORIGIN: `http://127.0.0.1:${proxyPort}`,
					// The proxy is ours: take the client's address from its X-Forwarded-For.
					ADDRESS_HEADER: 'x-forwarded-for',
					XFF_DEPTH: '1'
				}
			: {};
	const env = { DB_NAME, AUTH_SECRET: secret, BODY_SIZE_LIMIT: '2M', ...behindProxy };
	const apps = [];
	for (let i = 0; i < processes; i++) apps.push(await startApp(env));
	const proxy =
		processes === 2
			? await startProxy(
					apps.map((a) => a.origin),
					proxyPort
				)
			: null;
	const origin = proxy?.origin ?? apps[0]!.origin;
	const label =
		processes === 2 ? `two app processes behind ${proxy?.kind}` : 'one app process (node build)';
	let ok = false;
	try {
		console.log(`warming up ${label} for ${WARM_UP_SECONDS} s`);
		const sessions = await signInCrowd(origin, CROWD);
		await run(origin, WARM_UP_SECONDS, sessions);
		await drain(`${origin}/api/health`);
		const samplers = apps.map((a) => rssSampler(a.process.pid ?? 0));
		const measured = [
			...apps.map((a, n) => ({ name: `app process ${n + 1}`, pid: a.process.pid ?? 0 })),
			{ name: 'MariaDB (mariadbd)', pid: mariadbPid() },
			...(proxy?.pid ? [{ name: proxy.kind, pid: proxy.pid }] : [])
		];
		const cpuBefore = measured.map((m) => cpuSeconds(m.pid));
		console.log(`timing ${label} for ${SECONDS} s at ${CONNECTIONS} connections`);
		const { result, tally } = await run(origin, SECONDS, sessions);
		const cpu = measured.map((m, n) => ({
			name: m.name,
			seconds: cpuSeconds(m.pid) - cpuBefore[n]!
		}));
		const memory = samplers.map((s, n) => ({
			name: `app process ${n + 1}`,
			samples: s.stop().samplesMb
		}));
		await drain(`${origin}/api/health`);
		ok = true;
		return { label, result, tally, memory, cpu };
	} finally {
		if (!ok) for (const a of apps) console.error(a.errors());
		await proxy?.stop();
		for (const a of apps) await a.stop();
	}
}

function prepareDatabase(): void {
	const env = { ...process.env, DB_NAMES: DB_NAME, DB_NAME };
	const sh = (args: string[]) => execFileSync('bash', args, { cwd: ROOT, env, stdio: 'pipe' });
	sh(['scripts/db.sh', 'start']);
	sh(['scripts/db.sh', 'recreate', DB_NAME]);
	for (const step of ['migrate', 'seed'])
		execFileSync('npx', ['tsx', `scripts/${step}.ts`, 'up'], { cwd: ROOT, env, stdio: 'pipe' });
	addCrowd(DB_NAME, CROWD);
}

function sideLines(side: SideReport): { lines: string[]; unexpected: number; flat: boolean } {
	const r = side.result;
	let unexpected = 0;
	let tooMany = 0;
	const kindRows = KINDS.map((kind) => {
		const counts = side.tally.statuses.get(kind.name) ?? new Map<number, number>();
		let expected = 0;
		let limited = 0;
		let other = 0;
		const others: string[] = [];
		for (const [status, n] of counts) {
			if (status === kind.expected) expected += n;
			else if (status === 429 && kind.name === 'password sign-in') limited += n;
			else {
				other += n;
				others.push(`${n} × ${status}`);
			}
		}
		unexpected += other;
		tooMany += limited;
		const lat = side.tally.latencies.get(kind.name) ?? [];
		return `| ${kind.name} | ${expected + limited + other} | ${kind.expected}: ${expected} | ${limited} | ${other === 0 ? '0' : `**${others.join(', ')}**`} | ${percentile(lat, 50).toFixed(0)} | ${percentile(lat, 99).toFixed(0)} |`;
	});
	const memory = side.memory.map((m) => memoryLine(m.name, m.samples));
	return {
		unexpected,
		flat: memory.every((m) => m.flat),
		lines: [
			`### ${side.label}`,
			'',
			`${r.requests.total} requests in ${r.duration.toFixed(0)} s: **${r.requests.average.toFixed(1)} requests/s**, latency p50 ${r.latency.p50} ms, **p99 ${r.latency.p99} ms**, max ${r.latency.max} ms; ${r.errors} connection errors, ${r.timeouts} timeouts (over 30 s); unexpected answers: **${unexpected}**; 429 from sign-in (expected): ${tooMany}.`,
			'',
			'| request | sent | expected status: count | 429 (expected) | unexpected | p50 (ms) | p99 (ms) |',
			'| --- | ---: | ---: | ---: | ---: | ---: | ---: |',
			...kindRows,
			'',
			`| CPU in the timed window (${r.duration.toFixed(0)} s) | CPU seconds | share of one core |`,
			'| --- | ---: | ---: |',
			...side.cpu.map(
				(c) =>
					`| ${c.name} | ${c.seconds.toFixed(1)} | ${((100 * c.seconds) / r.duration).toFixed(0)} % |`
			),
			'',
			'| resident memory (MB) | first quarter mean | last quarter mean | max | over the run |',
			'| --- | ---: | ---: | ---: | --- |',
			...memory.map((m) => m.line),
			''
		]
	};
}

async function main(): Promise<void> {
	if (!process.env.DB_PORT) {
		const saved = resolve(ROOT, '.data/db.port');
		process.env.DB_PORT = existsSync(saved) ? readFileSync(saved, 'utf8').trim() : '3307';
	}
	process.env.AUTH_SECRET ??= randomBytes(32).toString('base64url');
	const startedNote = `Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineNotes()}.`;
	console.log(`preparing ${DB_NAME} (fresh, migrated, seeded)`);
	prepareDatabase();
	const sides: SideReport[] = [];
	for (let round = 0; round < ROUNDS; round++) {
		sides.push(await oneSide(1));
		sides.push(await oneSide(2));
	}
	const reports = sides.map(sideLines);
	const rps = (n: number) =>
		mean(
			sides
				.filter((s) => s.label.startsWith(n === 1 ? 'one' : 'two'))
				.map((s) => s.result.requests.average)
		);
	const lines = [
		'## Mixed load: one and two app processes (`npm run bench:load`)',
		'',
		startedNote,
		'',
		`autocannon on loopback, ${CONNECTIONS} connections, ${SECONDS} s timed after a ${WARM_UP_SECONDS} s warm-up and a drain,`,
		`${ROUNDS} round(s) per side, one process first. Every connection repeats one visit: a guide page (the four demo`,
		'guides in turn), the guide list, a guide re-priced in a region (JSON), a fit check of a seven-part build (JSON),',
		`a fork and an edit of that fork (signed in, by the next of ${CROWD} readers), and a password sign-in of the`,
		'demo reader. A fresh seeded database of its own;',
		'MariaDB, the proxy, autocannon and the app processes share the machine.',
		'',
		...reports.flatMap((r) => r.lines),
		`Two processes / one: **${(rps(2) / rps(1)).toFixed(2)}×** the requests per second. Unexpected answers over all runs:`,
		`**${reports.reduce((a, r) => a + r.unexpected, 0)}**; memory ${reports.every((r) => r.flat) ? 'flat in every process' : '**grew in at least one process**'}.`,
		'Per-kind latencies are measured from this process from the moment a request is built, so they include',
		"autocannon's own queueing; the p99 in each side's summary is autocannon's over all requests."
	];
	console.log(lines.join('\n'));
	if (process.env.BENCH_WRITE !== '0') console.log(`written: ${writeBenchSection('load', lines)}`);
}

main().catch((error: unknown) => {
	console.error(error);
	process.exit(1);
});
