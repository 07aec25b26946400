/**
 * Is a price an author proposes far from what the part has recently cost? The rule is
 * "common practice, no published source": a proposal more than 50 % below or above the
 * median of the part's quotes in the same region over the last 90 days is an outlier.
 * The median, not the mean, so one odd quote cannot move the yardstick much.
 */
export const OUTLIER_WINDOW_DAYS = 90;
export const OUTLIER_BAND = 0.5;

export type PriceOutlier =
	| { kind: 'no_history' }
	| { kind: 'in_range' | 'low' | 'high'; medianMinor: number; sampleSize: number };

/** The median of integer amounts (the mean of the middle two for an even count), or null for none. */
export function medianOf(values: readonly number[]): number | null {
	if (values.length === 0) return null;
	const sorted = [...values].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	const upper = sorted[mid] ?? 0;
	return sorted.length % 2 === 1 ? upper : ((sorted[mid - 1] ?? 0) + upper) / 2;
}

/** The verdict on `amountMinor` against recent amounts in the same currency. */
export function priceOutlier(amountMinor: number, recentMinor: readonly number[]): PriceOutlier {
	const median = medianOf(recentMinor);
	if (median === null) return { kind: 'no_history' };
	const base = { medianMinor: median, sampleSize: recentMinor.length };
	if (amountMinor < median * (1 - OUTLIER_BAND)) return { kind: 'low', ...base };
	if (amountMinor > median * (1 + OUTLIER_BAND)) return { kind: 'high', ...base };
	return { kind: 'in_range', ...base };
}
