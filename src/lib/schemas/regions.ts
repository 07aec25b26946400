import { z } from 'zod';
import { MAX_ID, isoDate, wholeNumberText } from './primitives';
import { PART_CATEGORIES, TAX_MODES, type PartCategory } from '$lib/domain/types';

/*
 * Inputs of the editor's region pages. Rates and factors are stored in basis points
 * (1 bp = 0.01 %, so 19 % = 1900 and a factor of ×1.04 = 104.00 % = 10400) and shown as
 * percentages with two decimals: the form and the column hold exactly the same values.
 */

/** Bounds of a category factor: a market is never a quarter or four times the base price. */
export const FACTOR_MIN_BP = 2_500;
export const FACTOR_MAX_BP = 40_000;
/** The highest standard VAT in the EU is 27 % (HU); 50 % leaves room and still catches typos. */
export const TAX_RATE_MAX_BP = 5_000;

/** "104.00" or "104" or "104.00 %" → 10400; null when it is not a percentage with ≤ 2 decimals. */
export function percentToBp(text: string): number | null {
	const match = /^(\d{1,5})(?:\.(\d{1,2}))?\s*%?$/.exec(text.trim());
	if (!match) return null;
	return Number(match[1]) * 100 + Number((match[2] ?? '').padEnd(2, '0'));
}

/** 10400 → "104.00" (the form's text; the page adds the % sign). */
export function bpToPercent(bp: number): string {
	const whole = Math.trunc(bp / 100);
	const rest = String(Math.abs(bp % 100)).padStart(2, '0');
	return `${whole}.${rest}`;
}

function percentField(label: string, minBp: number, maxBp: number) {
	return z.string({ error: `Enter ${label} as a percentage.` }).transform((text, ctx) => {
		const bp = percentToBp(text);
		if (bp === null) {
			ctx.addIssue({
				code: 'custom',
				message: `Enter ${label} as a percentage with at most two decimals, e.g. ${bpToPercent(minBp === 0 ? 1900 : 10400)}.`
			});
			return z.NEVER;
		}
		if (bp < minBp || bp > maxBp) {
			ctx.addIssue({
				code: 'custom',
				message: `Use a value from ${bpToPercent(minBp)} % to ${bpToPercent(maxBp)} %.`
			});
			return z.NEVER;
		}
		return bp;
	});
}

const factorFields = Object.fromEntries(
	PART_CATEGORIES.map((c) => [
		`factor.${c}`,
		percentField('the factor', FACTOR_MIN_BP, FACTOR_MAX_BP)
	])
) as Record<`factor.${PartCategory}`, ReturnType<typeof percentField>>;

/** POST ?/settings on /editor/regions/[code]: name, currency, tax display mode and one factor per category. */
export const regionSettingsInput = z
	.strictObject({
		name: z
			.string({ error: 'Enter the region name.' })
			.trim()
			.min(1, 'Enter the region name.')
			.max(80, 'Use at most 80 characters.')
			.refine((v) => !/[\p{Cc}<>]/u.test(v), 'Use plain text on one line.'),
		currency: z
			.string({ error: 'Enter the currency code.' })
			.trim()
			.toUpperCase()
			.regex(/^[A-Z]{3}$/, 'Use a three-letter ISO 4217 code, e.g. EUR.'),
		taxMode: z.enum(TAX_MODES, { error: 'Choose whether shelf prices include tax.' }),
		...factorFields
	})
	.transform(({ name, currency, taxMode, ...factors }) => ({
		name,
		currency,
		taxMode,
		categoryFactorsBp: Object.fromEntries(
			PART_CATEGORIES.map((c) => [c, factors[`factor.${c}`]])
		) as Record<PartCategory, number>
	}));
export type RegionSettingsInput = z.output<typeof regionSettingsInput>;

const effectiveDate = isoDate({ missing: 'Enter the date the rate takes effect.' }).refine(
	(d) => d >= '1954-01-01' && d <= '2100-12-31',
	'Enter a date between 1954 and 2100.'
);

/** POST ?/addRate: a rate that applies from `effectiveFrom` on (a future date is fine: announced changes). */
export const taxRateInput = z.strictObject({
	rate: percentField('the rate', 0, TAX_RATE_MAX_BP),
	effectiveFrom: effectiveDate,
	note: z
		.string()
		.trim()
		.max(200, 'Keep the note to at most 200 characters.')
		.refine((v) => !/[\p{Cc}<>]/u.test(v), 'Use plain text on one line.')
		.default('')
		.transform((v) => (v === '' ? null : v))
});
export type TaxRateInput = z.output<typeof taxRateInput>;

/** POST ?/removeRate */
export const removeTaxRateInput = z.strictObject({
	rateId: wholeNumberText('Unknown rate.', 1, MAX_ID)
});

/** The region code in /editor/regions/[code]. */
export const regionCodeParam = z.string().regex(/^[a-z]{2,8}$/);
