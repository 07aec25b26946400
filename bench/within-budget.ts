/*
 * Benchmark (not a test): the within-budget solver (branch and bound) on 12 slots × 6
 * options (the current part + 5 alternates), and brute force against it on 7 × 6, where
 * brute force can finish. Goal: the 12 × 6 instance under 50 ms.
 * Run: npm run bench:within-budget  (plain Node via tsx; relative imports, no Vite).
 *
 * Instances are random but seeded (mulberry32), so every run solves the same ones. Prices
 * are line prices in cents, 30.00–600.00. Conflicts sit between slots that the fit rules
 * relate (CPU–board, CPU–cooler, board–memory, board–case, board–drives, graphics card–
 * case, graphics card–PSU, cooler–case, PSU–case): each option pair of related slots
 * conflicts with probability 20 %; unrelated slots never conflict. A second set adds 3 %
 * conflicts between every pair of slots. The conflict callback looks pairs up in a Set,
 * as a caller with precomputed fit answers would; its calls are inside the timed solve.
 */
import { performance } from 'node:perf_hooks';
import {
	bruteForce,
	withinBudget,
	type BudgetSlot,
	type WithinBudgetInput,
	type WithinBudgetResult
} from '../src/lib/domain/within-budget';

function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const SLOT_KEYS = [
	'cpu',
	'cooler',
	'board',
	'memory',
	'drive-1',
	'drive-2',
	'gpu',
	'psu',
	'case',
	'fans',
	'os',
	'extra'
];
const RELATED: [string, string][] = [
	['cpu', 'board'],
	['cpu', 'cooler'],
	['board', 'memory'],
	['board', 'case'],
	['board', 'drive-1'],
	['board', 'drive-2'],
	['gpu', 'case'],
	['gpu', 'psu'],
	['cooler', 'case'],
	['psu', 'case'],
	['cpu', 'memory']
];

interface Spec {
	slots: number;
	options: number;
	/** Conflict probability for option pairs of related slots, and for all other pairs. */
	related: number;
	background: number;
	/** Budget as a share of the current total; 'below-cheapest' makes nothing fit. */
	budget: number | 'below-cheapest';
	/** Prices from a few steps only (many equal totals, the worst case for tie-breaks). */
	coarse?: boolean;
}

function instance(seed: number, spec: Spec): WithinBudgetInput {
	const rand = mulberry32(seed);
	const price = () =>
		spec.coarse ? 10_000 * (1 + Math.floor(rand() * 4)) : 3_000 + Math.floor(rand() * 57_000);
	const keys = SLOT_KEYS.slice(0, spec.slots);
	const slots: BudgetSlot[] = keys.map((key) => ({
		key,
		current: { id: `${key}#0`, price: price() },
		alternates: Array.from({ length: spec.options - 1 }, (_, j) => ({
			id: `${key}#${j + 1}`,
			price: price()
		}))
	}));
	const related = new Set(RELATED.map(([a, b]) => `${a}|${b}`));
	const conflicting = new Set<string>();
	for (let i = 0; i < keys.length; i++) {
		for (let j = i + 1; j < keys.length; j++) {
			const rate =
				related.has(`${keys[i]}|${keys[j]}`) || related.has(`${keys[j]}|${keys[i]}`)
					? spec.related
					: spec.background;
			for (let a = 0; a < spec.options; a++)
				for (let b = 0; b < spec.options; b++)
					if (rand() < rate) conflicting.add(`${i}.${a}|${j}.${b}`);
		}
	}
	const input: WithinBudgetInput = {
		slots,
		budget: 0,
		conflicts: (a, b) => conflicting.has(`${a.slot}.${a.option}|${b.slot}.${b.option}`)
	};
	if (spec.budget === 'below-cheapest') {
		// Prices are at least 30.00, so a budget of 0 fits nothing and the answer names the cheapest conflict-free total.
		const open = withinBudget({ ...input, budget: 0 });
		input.budget = !open.ok && open.cheapestTotal !== null ? open.cheapestTotal - 1 : 0;
	} else {
		input.budget = Math.round(slots.reduce((t, s) => t + s.current.price, 0) * spec.budget);
	}
	return input;
}

function median(samples: number[]): number {
	const sorted = [...samples].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** Median wall time of `fn` in ms over `runs` runs, after `warmup` untimed runs. */
function time(fn: () => unknown, runs: number, warmup: number): number {
	for (let i = 0; i < warmup; i++) fn();
	const samples: number[] = [];
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		fn();
		samples.push(performance.now() - start);
	}
	return median(samples);
}

const ms = (x: number) => `${x.toFixed(3)} ms`;

function outcome(r: WithinBudgetResult): string {
	return r.ok
		? `${r.changes} changes`
		: r.reason === 'over_budget'
			? 'over budget'
			: 'no conflict-free';
}

const INSTANCES = 25;

interface Row {
	label: string;
	median: number;
	worst: number;
	outcomes: Map<string, number>;
	nodes: number;
}

function scenario(label: string, spec: Spec): Row {
	const times: number[] = [];
	const nodes: number[] = [];
	const outcomes = new Map<string, number>();
	for (let s = 0; s < INSTANCES; s++) {
		const input = instance(1000 + s, spec);
		const r = withinBudget(input);
		outcomes.set(outcome(r), (outcomes.get(outcome(r)) ?? 0) + 1);
		nodes.push(r.nodes);
		times.push(time(() => withinBudget(input), 15, 5));
	}
	return {
		label,
		median: median(times),
		worst: Math.max(...times),
		outcomes,
		nodes: median(nodes)
	};
}

// The very first solve in this process, before the JIT has seen the code.
const coldInput = instance(999, {
	slots: 12,
	options: 6,
	related: 0.2,
	background: 0,
	budget: 0.85
});
const coldStart = performance.now();
withinBudget(coldInput);
const cold = performance.now() - coldStart;

console.log(
	`Slotwise within-budget benchmark (Node ${process.version}), ${INSTANCES} seeded instances per line`
);
console.log(`first solve in the process (cold, 12 × 6): ${ms(cold)}`);
console.log(
	'instance                                          | median of per-instance medians | slowest instance | median nodes | outcomes'
);
const rows = [
	scenario('12 × 6, related conflicts, budget 85 %', {
		slots: 12,
		options: 6,
		related: 0.2,
		background: 0,
		budget: 0.85
	}),
	scenario('12 × 6, related conflicts, budget 70 %', {
		slots: 12,
		options: 6,
		related: 0.2,
		background: 0,
		budget: 0.7
	}),
	scenario('12 × 6, + 3 % conflicts anywhere, budget 85 %', {
		slots: 12,
		options: 6,
		related: 0.2,
		background: 0.03,
		budget: 0.85
	}),
	scenario('12 × 6, related conflicts, budget 1 below cheapest', {
		slots: 12,
		options: 6,
		related: 0.2,
		background: 0,
		budget: 'below-cheapest'
	}),
	scenario('12 × 6, 4 price steps (many ties), budget 85 %', {
		slots: 12,
		options: 6,
		related: 0.2,
		background: 0,
		budget: 0.85,
		coarse: true
	}),
	scenario('12 × 6, 4 price steps, budget 1 below cheapest', {
		slots: 12,
		options: 6,
		related: 0.2,
		background: 0,
		budget: 'below-cheapest',
		coarse: true
	})
];
for (const r of rows) {
	const o = [...r.outcomes].map(([k, v]) => `${v}× ${k}`).join(', ');
	console.log(
		`${r.label.padEnd(50)}| ${ms(r.median).padStart(30)} | ${ms(r.worst).padStart(16)} | ${String(r.nodes).padStart(12)} | ${o}`
	);
}

// Brute force against branch and bound on 7 × 6 (6^7 = 279,936 combinations).
const smallSpec: Spec = { slots: 7, options: 6, related: 0.2, background: 0, budget: 0.85 };
const bfTimes: number[] = [];
const bbTimes: number[] = [];
const ratios: number[] = [];
let agree = 0;
const SMALL = 7;
for (let s = 0; s < SMALL; s++) {
	const input = instance(2000 + s, smallSpec);
	const bb = withinBudget(input);
	const bf = bruteForce(input);
	if (JSON.stringify({ ...bb, nodes: 0 }) === JSON.stringify({ ...bf, nodes: 0 })) agree++;
	const tb = time(() => withinBudget(input), 25, 5);
	const tf = time(() => bruteForce(input), 3, 1);
	bbTimes.push(tb);
	bfTimes.push(tf);
	ratios.push(tf / tb);
}
console.log('');
console.log(
	`7 × 6 (brute force: 279,936 combinations), ${SMALL} seeded instances, related conflicts, budget 85 %:`
);
console.log(`  branch and bound, median: ${ms(median(bbTimes))}`);
console.log(`  brute force, median:      ${ms(median(bfTimes))}`);
console.log(
	`  ratio brute force / branch and bound, median of per-instance ratios: ${median(ratios).toFixed(0)}× (min ${Math.min(...ratios).toFixed(0)}×, max ${Math.max(...ratios).toFixed(0)}×)`
);
console.log(`  same answer (changes, total, choice or explanation): ${agree} of ${SMALL}`);
const main = rows[0]!;
const slowest = Math.max(...rows.map((r) => r.worst));
console.log('');
console.log(
	`goal (12 × 6 under 50 ms): median ${ms(main.median)} — ${main.median < 50 ? 'met' : 'NOT met'}; slowest instance of any line ${ms(slowest)} — ${slowest < 50 ? 'met' : 'NOT met'}`
);
