/*
 * Benchmark (not a test): the production server on a seeded guide page against a bare
 * node:http server, in its own process, returning the very same HTML bytes; both under
 * autocannon on loopback with 50 connections, in alternating warmed-up and drained rounds
 * (bench/lib/harness.ts). The ratio app/bare says how much of the ceiling the app's own
 * work (routing, hooks, DB queries, pricing, rendering) costs on this machine.
 *
 * Run: npm run bench:guide-page, after `vite build`, against a migrated and seeded DB:
 *   DB_NAME=slotwise npm run bench:guide-page
 * Options (env): BENCH_SLUG (default steady-1080p-starter), BENCH_ROUNDS (3),
 * BENCH_SECONDS (minimum timed window, 10), BENCH_CONNECTIONS (50), BENCH_WRITE=0 to skip
 * writing docs/benchmarks.md.
 */
import {
	FIGURES_HEADER,
	compare,
	figuresRow,
	machineNotes,
	rssSampler,
	startApp,
	startBare,
	writeBenchSection
} from './lib/harness';

const SLUG = process.env.BENCH_SLUG ?? 'steady-1080p-starter';
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);

async function main(): Promise<void> {
	const app = await startApp({ DB_NAME: process.env.DB_NAME ?? 'slotwise' });
	const memory = rssSampler(app.process.pid ?? 0);
	let bare: { url: string; stop: () => void } | null = null;
	let ok = false;
	try {
		const pageUrl = `${app.origin}/guides/${SLUG}`;
		const first = await fetch(pageUrl);
		if (first.status !== 200)
			throw new Error(`${pageUrl} answered ${first.status}; is the DB seeded?`);
		const html = Buffer.from(await first.arrayBuffer());
		bare = await startBare(html, first.headers.get('content-type') ?? 'text/html');
		const result = await compare({
			app: { url: pageUrl },
			bare: { url: bare.url },
			idleUrl: `${app.origin}/api/health`,
			rounds: ROUNDS,
			connections: CONNECTIONS,
			minSeconds: SECONDS
		});
		const rss = memory.stop();
		const lines = [
			'## Guide page: production server vs a bare HTTP server (`npm run bench:guide-page`)',
			'',
			`Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineNotes()}.`,
			'',
			`Page \`/guides/${SLUG}\` (${html.length} bytes of HTML) from \`node build\`, and the same`,
			'bytes from a bare `node:http` server in its own process; autocannon on loopback,',
			`${CONNECTIONS} connections, ${ROUNDS} alternating rounds, each warmed up for 3 s, drained,`,
			'then timed for at least ' +
				`${SECONDS} s and 5 × the warm-up p99; figures are means over rounds.`,
			'',
			...FIGURES_HEADER,
			figuresRow('app (node build)', result.app),
			figuresRow('bare node:http, same bytes', result.bare),
			'',
			`Ratio app/bare: **${result.ratio.toFixed(3)}**. App resident memory: at most ${rss.maxMb.toFixed(0)} MB.`
		];
		console.log(lines.join('\n'));
		if (process.env.BENCH_WRITE !== '0')
			console.log(`written: ${writeBenchSection('guide-page', lines)}`);
		ok = true;
	} finally {
		if (!ok) console.error(app.errors());
		bare?.stop();
		await app.stop();
	}
}

main().catch((err: unknown) => {
	console.error(err);
	process.exit(1);
});
