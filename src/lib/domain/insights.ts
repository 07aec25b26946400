/**
 * The rules of fork insights (issue 19), as plain functions:
 * - a count of builds from 1 to 4 is shown as "fewer than 5", so no reader's choices can be
 *   singled out (k-anonymity style, k = 5); 0 and 5 or more are shown as they are, unless a
 *   table's totals would give a small count away (coverTable below);
 * - a part that builds swapped a slot to is suggested as an alternate when at least 20 % of
 *   the slot's builds, and at least 5 builds, chose it.
 */

/** Smallest count shown as a number (besides 0). */
export const K_ANONYMITY = 5;
/** Share of a slot's builds (percent) that makes a common swap a suggestion. */
export const SUGGEST_PERCENT = 20;

/** `count` null: hidden, as "fewer than 5" when it is, else as "hidden" (coverTable). */
export interface BuildCount {
	count: number | null;
	fewerThan5: boolean;
}

export function buildCount(n: number): BuildCount {
	return n === 0 || n >= K_ANONYMITY
		? { count: n, fewerThan5: false }
		: { count: null, fewerThan5: true };
}

/** At least 20 % of the slot's `total` builds and at least 5 builds (integers, no rounding). */
export function suggested(n: number, total: number): boolean {
	return n >= K_ANONYMITY && n * 100 >= SUGGEST_PERCENT * total;
}

/** A count as shown: `hidden` when "fewer than 5" alone would let it be worked out. */
export function shownCount(n: number, hidden: boolean): BuildCount {
	if (!hidden) return { count: n, fewerThan5: false };
	return { count: null, fewerThan5: n > 0 && n < K_ANONYMITY };
}
