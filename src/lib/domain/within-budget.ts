/* eslint-disable @typescript-eslint/no-non-null-assertion -- the solver indexes typed arrays and
   per-slot tables it sized itself; every index is in range by construction. */
/**
 * Within budget (docs/architecture.md "Computations" §8): from each slot's current part and its
 * alternates, the combination that has no conflict, costs at most the reader's budget and
 * changes the fewest slots from the current picks. Ties: lower total, then a fixed
 * preference (see `preferenceOrder`): slot by slot in the order given, the current part
 * before the alternates and cheaper alternates before dearer ones. Branch and bound;
 * `bruteForce` is the baseline the benchmark times it against; the tests check the solver
 * against an independent oracle in tests/ that shares no code with this module.
 *
 * Prices are line prices (unit price × quantity) in integer minor units of the reader's
 * currency, already adjusted to the reader's region by the caller.
 *
 * Conflicts. The fit rules are almost all about two parts (socket, memory type, board form
 * factor vs case, card length vs case, cooler height vs case, connectors, M.2 slots), so
 * the caller supplies a pairwise check; it is called once per pair of options in
 * different slots and the answers are kept as bit masks, which the search intersects as
 * it assigns slots (forward checking). Rules about more than two parts (the PSU rating
 * against the load of CPU + graphics card + the rest) are not pairwise: pass them as
 * `fullCheck`, which runs on every complete candidate that passes the pairwise masks and
 * the budget. The answer stays exact; such rules just prune later. `unusable` rules out a
 * single option on its own (e.g. an alternate with no price in the region).
 *
 * Search. Iterative deepening on the number of changed slots k = 0, 1, 2, …; within a
 * level, depth-first over the slots in the order given, options in preference order, so
 * complete candidates are met in tie-break order and only a strictly lower total replaces
 * the best one. A branch is cut when a slot has no option left, when the slots that must
 * change exceed k (slots whose current part is ruled out, plus one per pair of open slots
 * whose current parts conflict, by a greedy matching), or when the lower bound on the
 * total exceeds the budget or reaches the best total found at this level. Lower bound:
 * each open slot at its current part when still allowed, otherwise at its cheapest
 * allowed option (a forced change), minus the largest savings (current − cheapest
 * allowed) that the changes left at this level can still buy. The first level with a solution has the fewest changes; the best total in it
 * wins. When no level has one, a last search with no budget and no limit on changes finds
 * the cheapest conflict-free total for the explanation.
 */

export interface BudgetOption {
	/** The caller's id (part id or alternate row id). */
	id: string | number;
	/** Line price: integer minor units, region-adjusted, quantity included. */
	price: number;
}

export interface BudgetSlot {
	key: string;
	/** The build's current part (for a fresh fork, the author's pick). */
	current: BudgetOption;
	alternates: readonly BudgetOption[];
}

/** One option of one slot: `option` 0 is the current part, 1… the alternates in order. */
export interface OptionRef {
	slot: number;
	slotKey: string;
	option: number;
	id: string | number;
	price: number;
}

export interface WithinBudgetInput {
	slots: readonly BudgetSlot[];
	/** Integer minor units; a total equal to the budget is within it. */
	budget: number;
	/** Do these two options (always of different slots, `a.slot < b.slot`) conflict? */
	conflicts?: (a: OptionRef, b: OptionRef) => boolean;
	/** Is this option ruled out on its own? */
	unusable?: (o: OptionRef) => boolean;
	/** Final check on a complete candidate (rules about three or more parts); false rejects it. */
	fullCheck?: (picks: readonly OptionRef[]) => boolean;
	/** Formats an amount for the explanation (default: "12345 minor units"). */
	formatAmount?: (minor: number) => string;
}

export interface Swap {
	slotKey: string;
	from: BudgetOption;
	to: BudgetOption;
	/** to.price − from.price (negative saves money). */
	delta: number;
}

export type NoFitReason = 'no_conflict_free_combination' | 'over_budget';

export type WithinBudgetResult =
	| {
			ok: true;
			/** Chosen option per slot (0 = keep the current part). */
			choice: number[];
			changes: number;
			total: number;
			currentTotal: number;
			swaps: Swap[];
			/** Search nodes visited (for the benchmark). */
			nodes: number;
	  }
	| {
			ok: false;
			reason: NoFitReason;
			budget: number;
			/** Cheapest total without a conflict; null when there is none. */
			cheapestTotal: number | null;
			/** cheapestTotal − budget; null when there is no conflict-free combination. */
			shortfall: number | null;
			/** The cheapest conflict-free combination (empty when there is none). */
			cheapestSwaps: Swap[];
			message: string;
			nodes: number;
	  };

/** Most options a slot may have (one bit each in a 32-bit mask). */
export const MAX_OPTIONS_PER_SLOT = 32;

function assertAmount(value: number, what: string): void {
	if (!Number.isSafeInteger(value) || value < 0)
		throw new RangeError(
			`${what} must be a non-negative integer amount of minor units, got ${value}`
		);
}

function validate(input: WithinBudgetInput): void {
	assertAmount(input.budget, 'budget');
	const keys = new Set<string>();
	for (const s of input.slots) {
		if (keys.has(s.key)) throw new RangeError(`two slots have the key "${s.key}"`);
		keys.add(s.key);
		if (s.alternates.length + 1 > MAX_OPTIONS_PER_SLOT)
			throw new RangeError(`slot "${s.key}" has more than ${MAX_OPTIONS_PER_SLOT} options`);
		assertAmount(s.current.price, `price of ${s.key} current`);
		s.alternates.forEach((a, i) => assertAmount(a.price, `price of ${s.key} alternate ${i + 1}`));
	}
}

function refsOf(slots: readonly BudgetSlot[]): OptionRef[][] {
	return slots.map((s, slot) =>
		[s.current, ...s.alternates].map((o, option) => ({
			slot,
			slotKey: s.key,
			option,
			id: o.id,
			price: o.price
		}))
	);
}

function optionAt(slot: BudgetSlot, option: number): BudgetOption {
	return option === 0 ? slot.current : slot.alternates[option - 1]!;
}

function swapsOf(slots: readonly BudgetSlot[], choice: readonly number[]): Swap[] {
	const swaps: Swap[] = [];
	slots.forEach((s, i) => {
		const o = choice[i] ?? 0;
		if (o === 0) return;
		const to = optionAt(s, o);
		swaps.push({ slotKey: s.key, from: s.current, to, delta: to.price - s.current.price });
	});
	return swaps;
}

/**
 * Per slot, the options in preference order: the current part first, then the
 * alternates cheapest first (equal prices: the order given). Ties between equal totals go
 * to the candidate whose preference ranks, read slot by slot in the order given, come
 * first.
 */
export function preferenceOrder(price: readonly (readonly number[])[]): number[][] {
	return price.map((p) => [
		0,
		...p
			.map((_, o) => o)
			.filter((o) => o !== 0)
			.sort((a, b) => p[a]! - p[b]! || a - b)
	]);
}

/** Lexicographic comparison of two vectors of equal length. */
function lexLess(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
	for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i]! < b[i]!;
	return false;
}

function noFit(
	input: WithinBudgetInput,
	cheapest: { total: number; choice: number[] } | null,
	nodes: number
): WithinBudgetResult {
	if (!cheapest) {
		return {
			ok: false,
			reason: 'no_conflict_free_combination',
			budget: input.budget,
			cheapestTotal: null,
			shortfall: null,
			cheapestSwaps: [],
			message:
				'No combination of the current parts and their alternates is free of conflicts, whatever the budget.',
			nodes
		};
	}
	const shortfall = cheapest.total - input.budget;
	const f = input.formatAmount ?? ((minor: number) => `${minor} minor units`);
	return {
		ok: false,
		reason: 'over_budget',
		budget: input.budget,
		cheapestTotal: cheapest.total,
		shortfall,
		cheapestSwaps: swapsOf(input.slots, cheapest.choice),
		message: `The cheapest combination without a conflict costs ${f(cheapest.total)}, ${f(shortfall)} over the budget of ${f(input.budget)}.`,
		nodes
	};
}

function found(
	input: WithinBudgetInput,
	choice: number[],
	total: number,
	nodes: number
): WithinBudgetResult {
	return {
		ok: true,
		choice,
		changes: choice.filter((o) => o !== 0).length,
		total,
		currentTotal: input.slots.reduce((t, s) => t + s.current.price, 0),
		swaps: swapsOf(input.slots, choice),
		nodes
	};
}

/** The branch-and-bound solver. */
export function withinBudget(input: WithinBudgetInput): WithinBudgetResult {
	validate(input);
	const slots = input.slots;
	const n = slots.length;
	const refs = refsOf(slots);
	const sizes = refs.map((r) => r.length);
	const price: number[][] = refs.map((r) => r.map((o) => o.price));

	// Options allowed on their own.
	const allowed0 = new Int32Array(n);
	for (let i = 0; i < n; i++) {
		let mask = 0;
		for (let o = 0; o < sizes[i]!; o++) if (!input.unusable?.(refs[i]![o]!)) mask |= 1 << o;
		allowed0[i] = mask;
	}
	// compat[(first[i] + o) * n + j]: options of slot j compatible with option o of slot i.
	const first: number[] = [];
	let count = 0;
	for (let i = 0; i < n; i++) {
		first.push(count);
		count += sizes[i]!;
	}
	const compat = new Int32Array(count * n).fill(-1);
	if (input.conflicts) {
		for (let i = 0; i < n; i++) {
			for (let j = i + 1; j < n; j++) {
				for (let a = 0; a < sizes[i]!; a++) {
					for (let b = 0; b < sizes[j]!; b++) {
						if (input.conflicts(refs[i]![a]!, refs[j]![b]!)) {
							compat[(first[i]! + a) * n + j]! &= ~(1 << b);
							compat[(first[j]! + b) * n + i]! &= ~(1 << a);
						}
					}
				}
			}
		}
	}

	// Slots in the order given; options tried in preference order (current first, then cheapest first).
	// The search meets candidates in tie-break order, so the first of equal totals is the winner.
	const byPrice = price.map((p) => p.map((_, o) => o).sort((a, b) => p[a]! - p[b]! || a - b));
	const tryOrder = preferenceOrder(price);

	// For each slot, the later slots whose current part conflicts with its current part (used
	// by the changes bound; only when the slots fit in a 31-bit mask).
	let currentConflicts: number[][] | null = null;
	if (n <= 31) {
		currentConflicts = Array.from({ length: n }, (_, i) =>
			Array.from({ length: n }, (_, j) => j).filter(
				(j) => j > i && !(compat[first[i]! * n + j]! & 1)
			)
		);
		if (currentConflicts.every((list) => list.length === 0)) currentConflicts = null;
	}

	const domains = new Int32Array((n + 1) * n);
	const choice = new Int32Array(n);
	const savings = new Float64Array(n);
	let nodes = 0;
	let bestTotal = Infinity;
	let bestChoice: Int32Array | null = null;
	let k = 0;
	let cap = 0;

	function cheapestIn(j: number, mask: number): number {
		for (const o of byPrice[j]!) if (mask & (1 << o)) return o;
		return -1;
	}

	function dfs(depth: number, total: number, changes: number): void {
		nodes++;
		const dom = depth * n;
		if (depth === n) {
			if (total > cap || total >= bestTotal) return;
			if (input.fullCheck && !input.fullCheck(Array.from(choice, (o, i) => refs[i]![o]!))) return;
			bestTotal = total;
			bestChoice = Int32Array.from(choice);
			return;
		}
		// Bound over the open slots.
		let base = 0;
		let forced = 0;
		let nSavings = 0;
		for (let j = depth; j < n; j++) {
			const mask = domains[dom + j]!;
			const cheapest = cheapestIn(j, mask);
			if (cheapest < 0) return;
			const p = price[j]!;
			if (mask & 1) {
				base += p[0]!;
				const s = p[0]! - p[cheapest]!;
				if (s > 0) savings[nSavings++] = s;
			} else {
				forced++;
				base += p[cheapest]!;
			}
		}
		let spare = k - changes - forced;
		if (spare < 0) return;
		// Open slots whose current parts conflict with each other: one of each pair must change.
		// A greedy matching of such pairs is a lower bound on those changes.
		if (currentConflicts) {
			let matched = 0;
			let pairs = 0;
			for (let i = depth; i < n && pairs <= spare; i++) {
				if (!(domains[dom + i]! & 1) || matched & (1 << i)) continue;
				for (const j of currentConflicts[i]!) {
					if (j < depth || !(domains[dom + j]! & 1) || matched & (1 << j)) continue;
					matched |= (1 << i) | (1 << j);
					pairs++;
					break;
				}
			}
			if (pairs > spare) return;
		}
		let bound = total + base;
		if (spare > 0 && nSavings > 0) {
			const sorted = savings.subarray(0, nSavings).sort();
			for (let s = nSavings - 1; s >= 0 && spare > 0; s--, spare--) bound -= sorted[s]!;
		}
		if (bound > cap || bound >= bestTotal) return;

		const j = depth;
		const mask = domains[dom + j]!;
		const next = dom + n;
		for (const o of tryOrder[j]!) {
			if (!(mask & (1 << o))) continue;
			const change = o === 0 ? 0 : 1;
			if (changes + change > k) continue;
			const t = total + price[j]![o]!;
			if (t > cap || t >= bestTotal) continue;
			const row = (first[j]! + o) * n;
			let dead = false;
			for (let x = depth + 1; x < n; x++) {
				const m = domains[dom + x]! & compat[row + x]!;
				if (m === 0) {
					dead = true;
					break;
				}
				domains[next + x] = m;
			}
			if (dead) continue;
			choice[j] = o;
			dfs(depth + 1, t, changes + change);
			choice[j] = 0;
		}
	}

	function run(maxChanges: number, limit: number): { total: number; choice: number[] } | null {
		k = maxChanges;
		cap = limit;
		bestTotal = Infinity;
		bestChoice = null;
		domains.set(allowed0, 0);
		choice.fill(0);
		dfs(0, 0, 0);
		const best = bestChoice as Int32Array | null;
		return best ? { total: bestTotal, choice: Array.from(best) } : null;
	}

	for (let level = 0; level <= n; level++) {
		const best = run(level, input.budget);
		if (best) return found(input, best.choice, best.total, nodes);
	}
	return noFit(input, run(n, Infinity), nodes);
}

/**
 * Every combination, checked pair by pair with the caller's callbacks (answers cached in a
 * plain table), the same objective and tie-breaks. Exponential: the benchmark's baseline.
 * It reuses this module's ordering and validation, so it is no independent check; the
 * tests use tests/unit/domain/within-budget-oracle.ts for that.
 */
export function bruteForce(input: WithinBudgetInput): WithinBudgetResult {
	validate(input);
	const slots = input.slots;
	const n = slots.length;
	const refs = refsOf(slots);
	const flat = refs.flat();
	const index = refs.map((r, i) =>
		r.map((_, o) => refs.slice(0, i).reduce((c, x) => c + x.length, 0) + o)
	);
	const bad: boolean[][] = flat.map(() => flat.map(() => false));
	if (input.conflicts) {
		for (const a of flat)
			for (const b of flat)
				if (a.slot < b.slot && input.conflicts(a, b)) {
					bad[index[a.slot]![a.option]!]![index[b.slot]![b.option]!] = true;
				}
	}
	const usable = flat.map((o) => !input.unusable?.(o));

	// Tie-break key: the option's place in the preference order, per slot.
	const rankOf = preferenceOrder(refs.map((r) => r.map((o) => o.price))).map((list) => {
		const rank: number[] = [];
		list.forEach((o, place) => (rank[o] = place));
		return rank;
	});
	let best: { changes: number; total: number; choice: number[]; rank: number[] } | null = null;
	let cheapest: { total: number; choice: number[]; rank: number[] } | null = null;
	let nodes = 0;
	const choice: number[] = new Array<number>(n).fill(0);
	const sizes = refs.map((r) => r.length);
	if (n === 0) return found(input, [], 0, 1);
	for (;;) {
		nodes++;
		let ok = true;
		for (let i = 0; i < n && ok; i++) {
			const gi = index[i]![choice[i]!]!;
			if (!usable[gi]) ok = false;
			for (let j = i + 1; j < n && ok; j++) if (bad[gi]![index[j]![choice[j]!]!]) ok = false;
		}
		if (ok && input.fullCheck && !input.fullCheck(choice.map((o, i) => refs[i]![o]!))) ok = false;
		if (ok) {
			const total = choice.reduce((t, o, i) => t + refs[i]![o]!.price, 0);
			const changes = choice.filter((o) => o !== 0).length;
			const rank = choice.map((o, i) => rankOf[i]![o]!);
			if (
				!cheapest ||
				total < cheapest.total ||
				(total === cheapest.total && lexLess(rank, cheapest.rank))
			) {
				cheapest = { total, choice: [...choice], rank };
			}
			if (
				total <= input.budget &&
				(!best ||
					changes < best.changes ||
					(changes === best.changes &&
						(total < best.total || (total === best.total && lexLess(rank, best.rank)))))
			) {
				best = { changes, total, choice: [...choice], rank };
			}
		}
		// Next combination (odometer, last slot fastest).
		let i = n - 1;
		while (i >= 0 && choice[i] === sizes[i]! - 1) choice[i--] = 0;
		if (i < 0) break;
		choice[i]!++;
	}
	return best ? found(input, best.choice, best.total, nodes) : noFit(input, cheapest, nodes);
}
