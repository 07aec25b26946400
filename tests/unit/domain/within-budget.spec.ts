import { describe, expect, it } from 'vitest';
import {
	withinBudget,
	type BudgetSlot,
	type OptionRef,
	type WithinBudgetInput,
	type WithinBudgetResult
} from '$lib/domain/within-budget';
import { oracle, oracleProblems } from './within-budget-oracle';

/*
 * "Within budget" is an optimisation, not a measurement: there is no published value to
 * check it against. The expected answers are worked examples by hand from the design rule
 * (docs/architecture.md "Computations" §8: no conflict, total ≤ budget, fewest slots changed from the
 * current picks, ties by lower total; Slotwise's own last tie-break: preference order, see
 * preferenceOrder in within-budget.ts), and the branch and bound is checked against an
 * independent oracle written from that rule in tests/ (within-budget-oracle.ts: its own
 * validation, enumeration and ordering; no code shared with the solver) on random instances.
 * Prices are invented minor units.
 */

// Worked example: three slots, current total 300.00 + 500.00 + 100.00 = 900.00.
const slots: BudgetSlot[] = [
	{ key: 'cpu', current: { id: 'A', price: 30_000 }, alternates: [{ id: 'B', price: 25_000 }] },
	{
		key: 'gpu',
		current: { id: 'G1', price: 50_000 },
		alternates: [
			{ id: 'G2', price: 40_000 },
			{ id: 'G3', price: 45_000 }
		]
	},
	{ key: 'psu', current: { id: 'P1', price: 10_000 }, alternates: [{ id: 'P2', price: 8_000 }] }
];
const pairs = (list: [string, string][]) => (a: OptionRef, b: OptionRef) =>
	list.some(([x, y]) => (a.id === x && b.id === y) || (a.id === y && b.id === x));

/** The solver's answer without its node count, the part the oracle has no view on. */
function answer(r: WithinBudgetResult) {
	const { nodes: _nodes, ...rest } = r;
	return rest;
}

function both(input: WithinBudgetInput): WithinBudgetResult {
	const bb = withinBudget(input);
	expect(answer(bb)).toEqual(oracle(input));
	return bb;
}

function swapIds(r: WithinBudgetResult): string[] {
	return r.ok ? r.swaps.map((s) => `${s.slotKey}:${s.from.id}→${s.to.id}`) : [];
}

describe('within budget: worked examples by hand', () => {
	it('keeps the current picks when they fit (a total equal to the budget is within it)', () => {
		const r = both({ slots, budget: 90_000 });
		expect(r).toMatchObject({
			ok: true,
			changes: 0,
			total: 90_000,
			currentTotal: 90_000,
			swaps: [],
			choice: [0, 0, 0]
		});
	});

	it('one cent over: one change, the cheapest single swap (gpu G1 → G2, 800.00)', () => {
		// Single swaps: cpu→B 850.00, gpu→G2 800.00, gpu→G3 850.00, psu→P2 880.00.
		const r = both({ slots, budget: 89_999 });
		expect(r).toMatchObject({ ok: true, changes: 1, total: 80_000 });
		expect(swapIds(r)).toEqual(['gpu:G1→G2']);
		expect(r.ok && r.swaps[0]!.delta).toBe(-10_000);
	});

	it('fewest changes beats a lower total: 2 swaps at 750.00, not 3 at 730.00', () => {
		// Two swaps: B+G2 750.00, B+G3 800.00, B+P2 830.00, G2+P2 780.00, G3+P2 830.00.
		const r = both({ slots, budget: 79_999 });
		expect(r).toMatchObject({ ok: true, changes: 2, total: 75_000 });
		expect(swapIds(r)).toEqual(['cpu:A→B', 'gpu:G1→G2']);
	});

	it('a conflict removes an option; equal totals go to the first in preference order', () => {
		// G2 conflicts with P1, so single swaps are B 850.00, G3 850.00, P2 880.00: tie at 850.00
		// between cpu→B and gpu→G3. Preference ranks slot by slot: cpu→B is [1,0,0], gpu→G3 is
		// [0,2,0] (G2 is the cheaper gpu alternate); [0,2,0] comes first.
		const r = both({ slots, budget: 89_999, conflicts: pairs([['G2', 'P1']]) });
		expect(r).toMatchObject({ ok: true, changes: 1, total: 85_000, choice: [0, 2, 0] });
		expect(swapIds(r)).toEqual(['gpu:G1→G3']);
	});

	it('current picks in conflict must change even with money to spare', () => {
		const r = both({ slots, budget: 1_000_000, conflicts: pairs([['A', 'G1']]) });
		// Fixes: cpu→B (850.00), gpu→G2 (800.00), gpu→G3 (850.00): the cheapest one change wins.
		expect(r).toMatchObject({ ok: true, changes: 1, total: 80_000 });
		expect(swapIds(r)).toEqual(['gpu:G1→G2']);
	});

	it('an unusable option is never proposed', () => {
		const r = both({ slots, budget: 89_999, unusable: (o) => o.id === 'G2' });
		expect(r).toMatchObject({ ok: true, changes: 1, total: 85_000 });
		expect(swapIds(r)).toEqual(['gpu:G1→G3']);
	});

	it('the full check (a rule about three parts) rejects a candidate and the next best wins', () => {
		// Say B + G2 + P1 overloads the supply (made-up three-part rule): the best 2-change
		// answer B+G2 (750.00) is rejected; next is G2+P2 780.00.
		const fullCheck = (picks: readonly OptionRef[]) =>
			!(picks[0]!.id === 'B' && picks[1]!.id === 'G2' && picks[2]!.id === 'P1');
		const r = both({ slots, budget: 79_999, fullCheck });
		expect(r).toMatchObject({ ok: true, changes: 2, total: 78_000 });
		expect(swapIds(r)).toEqual(['gpu:G1→G2', 'psu:P1→P2']);
	});

	it('explains a budget below the cheapest conflict-free total', () => {
		// Cheapest of all: B + G2 + P2 = 730.00; budget 729.99.
		const r = both({ slots, budget: 72_999, formatAmount: (m) => `$${(m / 100).toFixed(2)}` });
		expect(r).toMatchObject({
			ok: false,
			reason: 'over_budget',
			budget: 72_999,
			cheapestTotal: 73_000,
			shortfall: 1
		});
		expect(!r.ok && r.message).toBe(
			'The cheapest combination without a conflict costs $730.00, $0.01 over the budget of $729.99.'
		);
		expect(!r.ok && r.cheapestSwaps.map((s) => s.to.id)).toEqual(['B', 'G2', 'P2']);
	});

	it('the explanation prices the cheapest combination that has no conflict', () => {
		// G2 conflicts with both PSUs: cheapest conflict-free is B + G3 + P2 = 780.00.
		const r = both({
			slots,
			budget: 70_000,
			conflicts: pairs([
				['G2', 'P1'],
				['G2', 'P2']
			])
		});
		expect(r).toMatchObject({
			ok: false,
			reason: 'over_budget',
			cheapestTotal: 78_000,
			shortfall: 8_000
		});
	});

	it('says so when no combination is free of conflicts, whatever the budget', () => {
		const conflicts = pairs([
			['A', 'G1'],
			['A', 'G2'],
			['A', 'G3'],
			['B', 'G1'],
			['B', 'G2'],
			['B', 'G3']
		]);
		const r = both({ slots, budget: 10_000_000, conflicts });
		expect(r).toMatchObject({
			ok: false,
			reason: 'no_conflict_free_combination',
			cheapestTotal: null,
			shortfall: null,
			cheapestSwaps: []
		});
		expect(!r.ok && r.message).toMatch(/No combination .* free of conflicts/);
	});

	it('a slot without alternates can only keep its part; no slots is an empty build at 0', () => {
		const r = both({
			slots: [{ key: 'os', current: { id: 'O', price: 12_000 }, alternates: [] }],
			budget: 11_999
		});
		expect(r).toMatchObject({
			ok: false,
			reason: 'over_budget',
			cheapestTotal: 12_000,
			shortfall: 1
		});
		expect(both({ slots: [], budget: 0 })).toMatchObject({
			ok: true,
			changes: 0,
			total: 0,
			swaps: []
		});
	});

	it('rejects prices and budgets that are not integer minor units, duplicate keys and oversized slots', () => {
		expect(() => withinBudget({ slots, budget: 10.5 })).toThrow(RangeError);
		expect(() => withinBudget({ slots, budget: -1 })).toThrow(RangeError);
		expect(() =>
			withinBudget({ slots: [{ ...slots[0]!, current: { id: 'A', price: 99.99 } }], budget: 1 })
		).toThrow('price of cpu current');
		expect(() => withinBudget({ slots: [slots[0]!, slots[0]!], budget: 1 })).toThrow(
			'two slots have the key "cpu"'
		);
		const many = Array.from({ length: 32 }, (_, i) => ({ id: i, price: 1 }));
		expect(() =>
			withinBudget({
				slots: [{ key: 'x', current: { id: 'c', price: 1 }, alternates: many }],
				budget: 1
			})
		).toThrow('more than 32 options');
	});

	it('refuses exactly the inputs the oracle refuses, and accepts 32 options (1 + 31 alternates) in a slot', () => {
		const cases: WithinBudgetInput[] = [
			{ slots, budget: 10.5 },
			{ slots, budget: -1 },
			{ slots, budget: Number.MAX_SAFE_INTEGER + 1 },
			{ slots: [{ ...slots[0]!, current: { id: 'A', price: 99.99 } }], budget: 1 },
			{ slots: [{ ...slots[0]!, alternates: [{ id: 'B', price: -5 }] }], budget: 1 },
			{ slots: [slots[0]!, slots[0]!], budget: 1 },
			{
				slots: [
					{
						key: 'x',
						current: { id: 'c', price: 1 },
						alternates: Array.from({ length: 32 }, (_, i) => ({ id: i, price: 1 }))
					}
				],
				budget: 1
			}
		];
		for (const input of cases) {
			expect(oracleProblems(input).length, JSON.stringify(input.budget)).toBeGreaterThan(0);
			expect(() => withinBudget(input)).toThrow(RangeError);
		}
		const full: WithinBudgetInput = {
			slots: [
				{
					key: 'x',
					current: { id: 'c', price: 3 },
					alternates: Array.from({ length: 31 }, (_, i) => ({ id: i, price: 31 - i }))
				}
			],
			budget: 1
		};
		expect(oracleProblems(full)).toEqual([]);
		// The cheapest alternate is the last one listed (price 31 − 30 = 1): one change, total 1.
		expect(both(full)).toMatchObject({ ok: true, changes: 1, total: 1, choice: [31] });
	});
});

/** mulberry32: a small seeded PRNG so the random instances are the same on every run. */
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

function randomInstance(rand: () => number): WithinBudgetInput {
	const int = (lo: number, hi: number) => lo + Math.floor(rand() * (hi - lo + 1));
	const n = int(1, 6);
	// Coarse prices (multiples of 10.00 in a small range) so equal totals, and so the tie-breaks, occur.
	const price = () => int(1, 12) * 1_000;
	const built: BudgetSlot[] = Array.from({ length: n }, (_, i) => ({
		key: `slot-${i}`,
		current: { id: `${i}.0`, price: price() },
		alternates: Array.from({ length: int(0, 4) }, (_, j) => ({
			id: `${i}.${j + 1}`,
			price: price()
		}))
	}));
	const conflictRate = [0, 0.1, 0.25, 0.5][int(0, 3)]!;
	const conflicting = new Set<string>();
	built.forEach((a, i) =>
		built.forEach((b, j) => {
			if (j <= i) return;
			for (let x = 0; x <= a.alternates.length; x++)
				for (let y = 0; y <= b.alternates.length; y++)
					if (rand() < conflictRate) conflicting.add(`${i}.${x}|${j}.${y}`);
		})
	);
	const currentTotal = built.reduce((t, s) => t + s.current.price, 0);
	const budget = Math.max(0, Math.round(currentTotal * (0.4 + rand() * 0.8)));
	const unusableSeed = int(0, 1000);
	const fullSeed = int(0, 1000);
	const withFull = rand() < 0.3;
	return {
		slots: built,
		budget,
		conflicts: (a, b) => conflicting.has(`${a.slot}.${a.option}|${b.slot}.${b.option}`),
		unusable:
			rand() < 0.3 ? (o) => (o.slot * 7 + o.option * 13 + unusableSeed) % 11 === 0 : undefined,
		// A deterministic stand-in for a rule about three or more parts: rejects some full combinations.
		fullCheck: withFull
			? (picks) => picks.reduce((h, p) => (h * 31 + p.option + 1) % 1009, fullSeed) % 5 !== 0
			: undefined
	};
}

describe('branch and bound against the independent oracle (seeded random instances)', () => {
	it('gives the same answer on 3,000 small instances: changes, total, choice, or the same explanation', () => {
		const rand = mulberry32(0x5107_0007);
		const tally = { fits: 0, overBudget: 0, noConflictFree: 0, withChanges: 0 };
		for (let i = 0; i < 3000; i++) {
			const input = randomInstance(rand);
			const bb = withinBudget(input);
			expect(answer(bb), `instance ${i}`).toEqual(oracle(input));
			if (bb.ok) {
				tally.fits++;
				if (bb.changes > 0) tally.withChanges++;
			} else if (bb.reason === 'over_budget') tally.overBudget++;
			else tally.noConflictFree++;
		}
		// The generator must reach every outcome, or the comparison proves little.
		expect(tally.fits).toBeGreaterThan(600);
		expect(tally.withChanges).toBeGreaterThan(300);
		expect(tally.overBudget).toBeGreaterThan(120);
		expect(tally.noConflictFree).toBeGreaterThan(30);
		// 3,000 exhaustive oracle runs take about a second alone; give a loaded machine room.
	}, 60_000);

	it('equal prices everywhere (every total ties) on 12 × 6 stay cheap: ties are settled by search order, not explored', () => {
		const flat: BudgetSlot[] = Array.from({ length: 12 }, (_, i) => ({
			key: `s${i}`,
			current: { id: `${i}.0`, price: 10_000 },
			alternates: Array.from({ length: 5 }, (_, j) => ({ id: `${i}.${j + 1}`, price: 10_000 }))
		}));
		// The current part of every even slot conflicts with the current part of the next slot: six forced changes.
		const conflicts = (a: OptionRef, b: OptionRef) =>
			a.option === 0 && b.option === 0 && a.slot % 2 === 0 && b.slot === a.slot + 1;
		const r = withinBudget({ slots: flat, budget: 120_000, conflicts });
		// Fewest changes: one per conflicting pair, the later slot (preference order keeps earlier
		// slots) to its first alternate (equal prices keep the order given).
		expect(r).toMatchObject({
			ok: true,
			changes: 6,
			total: 120_000,
			choice: [0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1]
		});
		expect(r.nodes).toBeLessThan(5_000);
		const none = withinBudget({ slots: flat, budget: 119_999, conflicts });
		expect(none).toMatchObject({
			ok: false,
			reason: 'over_budget',
			cheapestTotal: 120_000,
			shortfall: 1
		});
		expect(none.nodes).toBeLessThan(50_000);
	});

	it('agrees with the oracle on a 7 × 6 instance while visiting far fewer nodes than the 6^7 = 279,936 combinations', () => {
		const rand = mulberry32(42);
		const built: BudgetSlot[] = Array.from({ length: 7 }, (_, i) => ({
			key: `s${i}`,
			current: { id: `${i}.0`, price: 5_000 + Math.floor(rand() * 50_000) },
			alternates: Array.from({ length: 5 }, (_, j) => ({
				id: `${i}.${j + 1}`,
				price: 5_000 + Math.floor(rand() * 50_000)
			}))
		}));
		const total = built.reduce((t, s) => t + s.current.price, 0);
		const input: WithinBudgetInput = {
			slots: built,
			budget: Math.round(total * 0.8),
			conflicts: (a, b) => (a.option * 5 + b.option * 3 + a.slot + b.slot) % 9 === 0
		};
		const bb = both(input);
		expect(bb.nodes).toBeLessThan(279_936 / 10);
	});
});
