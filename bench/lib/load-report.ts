/**
 * What bench/load.ts counts and how it reports one side of the run (one or two app
 * processes): the kinds of request and their expected status, the tally, and the tables.
 */

export interface Kind {
	name: string;
	expected: number;
}
export const KINDS: Kind[] = [
	{ name: 'guide page', expected: 200 },
	{ name: 'guide list', expected: 200 },
	{ name: 're-price in a region (JSON)', expected: 200 },
	{ name: 'fit check (JSON)', expected: 200 },
	{ name: 'fork (signed in)', expected: 201 },
	{ name: 'edit the fork (signed in)', expected: 200 },
	{ name: 'password sign-in', expected: 303 }
];

export interface Tally {
	statuses: Map<string, Map<number, number>>;
	latencies: Map<string, number[]>;
}

export interface CannonResult {
	requests: { average: number; total: number };
	latency: { p50: number; p99: number; max: number };
	errors: number;
	timeouts: number;
	duration: number;
}

const percentile = (xs: number[], p: number) => {
	const sorted = [...xs].sort((a, b) => a - b);
	return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? 0;
};
export const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);

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

export interface SideReport {
	label: string;
	result: CannonResult;
	tally: Tally;
	memory: { name: string; samples: number[] }[];
	/** CPU seconds used during the timed window, per process. */
	cpu: { name: string; seconds: number }[];
}

export function sideLines(side: SideReport): {
	lines: string[];
	unexpected: number;
	flat: boolean;
} {
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
