/*
 * An independent oracle for "within budget", written from the rule as the design states it
 * (docs/architecture.md "Computations" §8, and the contract in the header of
 * src/lib/domain/within-budget.ts), sharing no code with the solver: its own validation,
 * its own enumeration (recursion over slots, not an odometer), its own preference ranks
 * (counted, not sorted) and its own comparison. Only the shape of the input and the result
 * is the same, so the two can be compared with toEqual.
 *
 * The rule:
 * - One option per slot: option 0 is the current part, 1… the alternates in the order given.
 * - A combination is admissible when no option is unusable, no two options of different
 *   slots conflict (asked with the lower slot first), and the full check (if any) accepts
 *   the complete combination.
 * - Among admissible combinations whose total is at most the budget: fewest changed slots,
 *   then the lowest total, then the preference order read slot by slot in the order given
 *   (the current part first, then alternates from cheapest to dearest, equal prices in the
 *   order given).
 * - When there is none: the cheapest admissible combination (same tie-break) explains the
 *   shortfall, or, when nothing is admissible, the answer says so.
 * - Budget and prices are non-negative safe integers, keys unique, at most 32 options a slot.
 */

export interface OracleOption {
	id: string | number;
	price: number;
}

export interface OracleSlot {
	key: string;
	current: OracleOption;
	alternates: readonly OracleOption[];
}

export interface OracleRef {
	slot: number;
	slotKey: string;
	option: number;
	id: string | number;
	price: number;
}

export interface OracleInput {
	slots: readonly OracleSlot[];
	budget: number;
	conflicts?: (a: OracleRef, b: OracleRef) => boolean;
	unusable?: (o: OracleRef) => boolean;
	fullCheck?: (picks: readonly OracleRef[]) => boolean;
	formatAmount?: (minor: number) => string;
}

interface OracleSwap {
	slotKey: string;
	from: OracleOption;
	to: OracleOption;
	delta: number;
}

export type OracleResult =
	| {
			ok: true;
			choice: number[];
			changes: number;
			total: number;
			currentTotal: number;
			swaps: OracleSwap[];
	  }
	| {
			ok: false;
			reason: 'no_conflict_free_combination' | 'over_budget';
			budget: number;
			cheapestTotal: number | null;
			shortfall: number | null;
			cheapestSwaps: OracleSwap[];
			message: string;
	  };

function isAmount(x: number): boolean {
	return Number.isSafeInteger(x) && x >= 0;
}

/** The reasons an input is refused, empty when it is valid. */
export function oracleProblems(input: OracleInput): string[] {
	const problems: string[] = [];
	if (!isAmount(input.budget)) problems.push('budget');
	const seen: string[] = [];
	for (const s of input.slots) {
		if (seen.includes(s.key)) problems.push(`duplicate key ${s.key}`);
		seen.push(s.key);
		if (1 + s.alternates.length > 32) problems.push(`too many options in ${s.key}`);
		if (!isAmount(s.current.price)) problems.push(`price of ${s.key}`);
		for (const a of s.alternates) if (!isAmount(a.price)) problems.push(`price in ${s.key}`);
	}
	return problems;
}

function optionsOf(slot: OracleSlot): OracleOption[] {
	return [slot.current, ...slot.alternates];
}

/**
 * Preference rank of each option of a slot: the current part 0; an alternate 1 + the number
 * of alternates that come before it (cheaper, or as cheap and listed earlier).
 */
function ranks(slot: OracleSlot): number[] {
	const alts = slot.alternates;
	return optionsOf(slot).map((option, o) => {
		if (o === 0) return 0;
		let before = 0;
		alts.forEach((other, j) => {
			if (other.price < option.price || (other.price === option.price && j + 1 < o)) before++;
		});
		return 1 + before;
	});
}

interface Candidate {
	choice: number[];
	total: number;
	changes: number;
	rank: number[];
}

/** Is `a` before `b` in the preference order (slot by slot, the first difference decides)? */
function prefers(a: readonly number[], b: readonly number[]): boolean {
	for (let i = 0; i < a.length; i++) {
		const x = a[i] as number;
		const y = b[i] as number;
		if (x !== y) return x < y;
	}
	return false;
}

function swapsFor(slots: readonly OracleSlot[], choice: readonly number[]): OracleSwap[] {
	const out: OracleSwap[] = [];
	for (let i = 0; i < slots.length; i++) {
		const slot = slots[i] as OracleSlot;
		const o = choice[i] as number;
		if (o === 0) continue;
		const to = optionsOf(slot)[o] as OracleOption;
		out.push({ slotKey: slot.key, from: slot.current, to, delta: to.price - slot.current.price });
	}
	return out;
}

export function oracle(input: OracleInput): OracleResult {
	const problems = oracleProblems(input);
	if (problems.length > 0) throw new RangeError(problems.join('; '));
	const slots = input.slots;
	const refs: OracleRef[][] = slots.map((slot, i) =>
		optionsOf(slot).map((o, option) => ({
			slot: i,
			slotKey: slot.key,
			option,
			id: o.id,
			price: o.price
		}))
	);
	const rankTable = slots.map(ranks);
	const admissible: Candidate[] = [];

	// Depth-first over slots; every complete combination is checked as a whole.
	const picked: OracleRef[] = [];
	const walk = (i: number): void => {
		if (i === slots.length) {
			if (picked.some((p) => input.unusable?.(p) === true)) return;
			for (let x = 0; x < picked.length; x++)
				for (let y = x + 1; y < picked.length; y++)
					if (input.conflicts?.(picked[x] as OracleRef, picked[y] as OracleRef) === true) return;
			if (input.fullCheck && !input.fullCheck([...picked])) return;
			const choice = picked.map((p) => p.option);
			admissible.push({
				choice,
				total: picked.reduce((t, p) => t + p.price, 0),
				changes: choice.filter((o) => o !== 0).length,
				rank: choice.map((o, s) => (rankTable[s] as number[])[o] as number)
			});
			return;
		}
		for (const ref of refs[i] as OracleRef[]) {
			picked.push(ref);
			walk(i + 1);
			picked.pop();
		}
	};
	walk(0);

	const cheaper = (a: Candidate, b: Candidate) =>
		a.total < b.total || (a.total === b.total && prefers(a.rank, b.rank));
	let best: Candidate | null = null;
	for (const c of admissible) {
		if (c.total > input.budget) continue;
		if (!best || c.changes < best.changes || (c.changes === best.changes && cheaper(c, best)))
			best = c;
	}
	if (best) {
		return {
			ok: true,
			choice: best.choice,
			changes: best.changes,
			total: best.total,
			currentTotal: slots.reduce((t, s) => t + s.current.price, 0),
			swaps: swapsFor(slots, best.choice)
		};
	}
	let cheapest: Candidate | null = null;
	for (const c of admissible) if (!cheapest || cheaper(c, cheapest)) cheapest = c;
	if (!cheapest) {
		return {
			ok: false,
			reason: 'no_conflict_free_combination',
			budget: input.budget,
			cheapestTotal: null,
			shortfall: null,
			cheapestSwaps: [],
			message:
				'No combination of the current parts and their alternates is free of conflicts, whatever the budget.'
		};
	}
	const money = input.formatAmount ?? ((m: number) => `${m} minor units`);
	const shortfall = cheapest.total - input.budget;
	return {
		ok: false,
		reason: 'over_budget',
		budget: input.budget,
		cheapestTotal: cheapest.total,
		shortfall,
		cheapestSwaps: swapsFor(slots, cheapest.choice),
		message: `The cheapest combination without a conflict costs ${money(cheapest.total)}, ${money(shortfall)} over the budget of ${money(input.budget)}.`
	};
}
