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
import { cpuSeconds, mariadbPid } from './lib/cpu-time';
import { KINDS, mean, sideLines } from './lib/load-report';
import type { CannonResult, SideReport, Tally } from './lib/load-report';
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
