/*
 * Numbers as the interface shows them (en-GB digit grouping), through formatters built once
 * per number of decimals. `n.toLocaleString('en-GB', { … })` builds a new Intl.NumberFormat
 * on every call; the frame-results chart alone made dozens per guide page, and they showed
 * in the page's render profile (like dates before date-format.ts).
 */
const fixed = new Map<number, Intl.NumberFormat>();
const upTo = new Map<number, Intl.NumberFormat>();

function formatter(cache: Map<number, Intl.NumberFormat>, digits: number, exact: boolean) {
	let made = cache.get(digits);
	if (!made) {
		made = new Intl.NumberFormat('en-GB', {
			minimumFractionDigits: exact ? digits : 0,
			maximumFractionDigits: digits
		});
		cache.set(digits, made);
	}
	return made;
}

/** `n` with exactly `digits` decimals: 1,234.50 for (1234.5, 2). */
export function fixedDecimals(n: number, digits: number): string {
	return formatter(fixed, digits, true).format(n);
}

/** `n` with at most `digits` decimals: 1,234.5 for (1234.5, 2), 12 for (12, 2). */
export function upToDecimals(n: number, digits: number): string {
	return formatter(upTo, digits, false).format(n);
}
