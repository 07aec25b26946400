import * as currencyCodes from 'currency-codes';
import * as dineroCurrencies from 'dinero.js/currencies';
import { describe, expect, it } from 'vitest';
import { minorUnitDigits, minorUnitsPerMajor } from '$lib/domain/money';

/*
 * money.ts takes minor units from dinero.js 2.0.2's currency records. They are checked here
 * against a second, independent copy of ISO 4217 List One: the XML bundled in the
 * `currency-codes` 2.2.0 package (maintenance agency SIX, Pblshd="2024-06-25"),
 * docs/sources.md 10a/10b (status V).
 *
 * Known differences (docs/sources.md notes 3 and 4, and what this test found):
 * - XCG (Caribbean guilder, replaced ANG in 2025) is newer than the 2024-06-25 list: dinero
 *   has it, currency-codes does not. ZWG is in both.
 * - HUF: ISO says 2 decimals (cash is whole forints; Slotwise follows ISO, not cash digits).
 * - MGA and MRU: ISO List One gives 2 minor-unit digits, while dinero models their real
 *   subdivisions (1 ariary = 5 iraimbilanja, 1 ouguiya = 5 khoums) as base 5, exponent 1.
 *   minorUnitDigits() returns dinero's exponent (1) for them, which is NOT the ISO value; the
 *   base-aware minorUnitsPerMajor() gives 5. Neither currency is used by any region today.
 */
const isoData = currencyCodes.data;
const dinero = dineroCurrencies as unknown as Record<
	string,
	{ code: string; base: number; exponent: number }
>;

const NON_DECIMAL = new Set(['MGA', 'MRU']);

describe('ISO 4217 minor units: money.ts vs currency-codes 2.2.0 (ISO 4217 List One, SIX, 2024-06-25 — V)', () => {
	it('bundles the 2024-06-25 list with 179 codes (docs/sources.md 10b)', () => {
		expect(currencyCodes.publishDate).toBe('2024-06-25');
		expect(isoData).toHaveLength(179);
	});

	it.each([
		['JPY', 0],
		['USD', 2],
		['KWD', 3]
	])('%s has %i decimals in both', (code, digits) => {
		expect(currencyCodes.code(code)?.digits).toBe(digits);
		expect(minorUnitDigits(code)).toBe(digits);
	});

	it('HUF has 2 decimals in ISO 4217 and in money.ts (docs/sources.md note 4)', () => {
		expect(currencyCodes.code('HUF')?.digits).toBe(2);
		expect(minorUnitDigits('HUF')).toBe(2);
	});

	it('XCG is missing from currency-codes 2.2.0 but known to money.ts (docs/sources.md note 3)', () => {
		expect(currencyCodes.code('XCG')).toBeUndefined();
		expect(minorUnitDigits('XCG')).toBe(2);
	});

	const common = isoData.filter((c) => c.code in dinero);

	it('shares at least 160 codes with dinero.js (so the comparison below covers the real list)', () => {
		expect(common.length).toBeGreaterThanOrEqual(160);
	});

	it('agrees on the minor unit of every decimal currency both know', () => {
		const mismatches = common
			.filter((c) => !NON_DECIMAL.has(c.code))
			.filter(
				(c) =>
					minorUnitDigits(c.code) !== c.digits ||
					minorUnitsPerMajor(c.code) !== 10n ** BigInt(c.digits)
			)
			.map((c) => `${c.code}: ISO ${c.digits}, money.ts ${minorUnitDigits(c.code)}`);
		expect(mismatches).toEqual([]);
	});

	it('MGA and MRU: ISO lists 2 digits, dinero models base 5 × 1; money.ts refuses them rather than misprice', () => {
		for (const code of NON_DECIMAL) {
			expect(currencyCodes.code(code)?.digits).toBe(2);
			expect(dinero[code]).toMatchObject({ base: 5, exponent: 1 });
			expect(() => minorUnitDigits(code)).toThrow(/non-decimal/);
		}
		// The full list of non-decimal currencies in dinero is exactly these two.
		expect(
			Object.values(dinero)
				.filter((c) => c.base !== 10)
				.map((c) => c.code)
				.sort()
		).toEqual(['MGA', 'MRU']);
	});
});
