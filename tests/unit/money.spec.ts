import { describe, expect, it } from 'vitest';
import {
	convertAt,
	decimalMarkOf,
	formatMoney,
	minorToDecimal,
	minorUnitDigits,
	money,
	multiply,
	parseAmount,
	sum
} from '$lib/domain/money';

/*
 * Sources (docs/sources.md):
 * 10a ISO 4217 List One, maintenance agency SIX, published 2024-06-25 (V).
 * 10c ECB euro foreign exchange reference rates for 2 Jan 2024 (V).
 * 10d worked conversions with dinero.js 2.0.2, half-even (D).
 * 10e decimal and grouping marks per region, Unicode CLDR as Node 20's ICU bundles it (V).
 */
describe('ISO 4217 minor units (ISO 4217 List One, SIX, 2024-06-25 — status V)', () => {
	it.each([
		['JPY', 0],
		['KRW', 0],
		['ISK', 0],
		['CLP', 0],
		['EUR', 2],
		['USD', 2],
		['GBP', 2],
		['PLN', 2],
		['SEK', 2],
		['HUF', 2],
		['KWD', 3],
		['BHD', 3],
		['OMR', 3],
		['JOD', 3],
		['TND', 3],
		['CLF', 4]
	])('%s has %i decimal places', (code, digits) => {
		expect(minorUnitDigits(code)).toBe(digits);
	});

	it('refuses an unknown currency code instead of guessing its exponent', () => {
		expect(() => minorUnitDigits('XXY')).toThrow(/Unknown ISO 4217/);
	});

	it('formats each currency with its ISO exponent', () => {
		expect(formatMoney(money(77838, 'JPY'))).toBe('JP¥77,838');
		expect(formatMoney(money(54779, 'USD'))).toBe('US$547.79');
		expect(formatMoney(money(1234, 'KWD'))).toBe('KWD\u00a01.234');
	});
});

describe('conversion and rounding to the minor unit (ECB reference rates 2 Jan 2024 — V; results D)', () => {
	const eur = money(49999, 'EUR');

	it('€499.99 × 1.0956 USD/EUR = 547.789044 → US$547.79 (2 decimals)', () => {
		expect(convertAt(eur, 'USD', '1.0956')).toEqual(money(54779, 'USD'));
	});

	it('€499.99 × 155.68 JPY/EUR = 77838.4432 → ¥77,838 (0 decimals)', () => {
		expect(convertAt(eur, 'JPY', '155.68')).toEqual(money(77838, 'JPY'));
	});

	it('€499.99 × 0.86645 GBP/EUR = 433.2163355 → £433.22 (2 decimals)', () => {
		expect(convertAt(eur, 'GBP', '0.86645')).toEqual(money(43322, 'GBP'));
	});

	it('rounds exact halves to the even neighbour (half-even, stated choice)', () => {
		// €0.05 × 0.5 = 0.025 → 0.02 (2 is even); €0.15 × 0.5 = 0.075 → 0.08 (8 is even). D.
		expect(convertAt(money(5, 'EUR'), 'USD', '0.5')).toEqual(money(2, 'USD'));
		expect(convertAt(money(15, 'EUR'), 'USD', '0.5')).toEqual(money(8, 'USD'));
		// ¥ has no minor unit: €0.25 × 2 = ¥0.5 → ¥0; €0.75 × 2 = ¥1.5 → ¥2. D.
		expect(convertAt(money(25, 'EUR'), 'JPY', '2')).toEqual(money(0, 'JPY'));
		expect(convertAt(money(75, 'EUR'), 'JPY', '2')).toEqual(money(2, 'JPY'));
	});

	it('converts into a 3-decimal currency without losing the third digit', () => {
		// €10.00 × 0.33781 = 3.3781 KWD → 3.378 (value of the rate is arbitrary here; arithmetic D).
		expect(convertAt(money(1000, 'EUR'), 'KWD', '0.33781')).toEqual(money(3378, 'KWD'));
	});

	it('refuses a rate that is not a plain decimal string', () => {
		expect(() => convertAt(eur, 'USD', '1e3')).toThrow(/decimal string/);
		expect(() => convertAt(eur, 'USD', '-1.2')).toThrow(/decimal string/);
	});
});

describe('sums in minor units', () => {
	it('adds integer amounts exactly (0.1 + 0.2 problem cannot occur)', () => {
		expect(sum([money(10, 'EUR'), money(20, 'EUR')], 'EUR')).toEqual(money(30, 'EUR'));
	});

	it('refuses to add different currencies without a conversion', () => {
		expect(() => sum([money(10, 'EUR'), money(20, 'USD')], 'EUR')).toThrow(/without conversion/);
	});

	it('refuses fractional minor units and quantities', () => {
		expect(() => money(10.5, 'EUR')).toThrow(/integer/);
		expect(() => multiply(money(10, 'EUR'), 1.5)).toThrow(/Quantity/);
	});
});

describe('typed amounts → minor units, read as the region writes them (10a exponents, 10e marks)', () => {
	it('knows which regions write the decimal comma (CLDR: de 1.299,90; us, uk, jp 1,299.90 — 10e, V)', () => {
		expect(decimalMarkOf('de')).toBe(',');
		expect(decimalMarkOf('us')).toBe('.');
		expect(decimalMarkOf('uk')).toBe('.');
		expect(decimalMarkOf('jp')).toBe('.');
		// Not an ISO 3166 country code: the plain point.
		expect(decimalMarkOf('latam')).toBe('.');
	});

	it.each([
		// EUR has 2 digits (10a): 129,90 € = 12990 cents. Worked by hand: 129 × 100 + 90.
		['129,90', 'EUR', ',', 12990],
		['129,9', 'EUR', ',', 12990],
		// 1.299,90 = one thousand two hundred ninety-nine euros ninety: 1299 × 100 + 90.
		['1.299,90', 'EUR', ',', 129990],
		['1\u00a0299,90', 'EUR', ',', 129990],
		['1.299.000', 'EUR', ',', 129900000],
		// The plain form the API documents is read the same everywhere.
		['129.90', 'EUR', ',', 12990],
		['1000.5', 'EUR', ',', 100050],
		// A point region: comma groups of three.
		['1,299.90', 'USD', '.', 129990],
		['1,299', 'USD', '.', 129900],
		// JPY has no minor unit (10a): ¥15,800 = 15800.
		['15,800', 'JPY', '.', 15800],
		['15800', 'JPY', '.', 15800],
		// KWD has 3 digits (10a): 1.234 KWD = 1234 fils; written 1,234 where the comma marks decimals.
		['1.234', 'KWD', '.', 1234],
		['1,234', 'KWD', ',', 1234],
		['1000.000', 'KWD', ',', 1000000]
	] as const)('%s %s (mark %s) → %i', (text, currency, mark, expected) => {
		expect(parseAmount(text, currency, mark)).toEqual({ ok: true, amountMinor: expected });
	});

	it('refuses ambiguous, over-precise and malformed amounts with a message that says how to write them', () => {
		// "1.299" is 1299 to a reader in Germany and 1.299 in the plain form: never guessed.
		// In EUR (2 digits) the plain reading has too many decimals; in KWD (3) both are amounts.
		expect(parseAmount('1.299', 'EUR', ',')).toEqual({
			ok: false,
			reason: 'digits',
			message: 'EUR allows at most 2 decimals, e.g. 129,99; for 1299 write 1299 without the point.'
		});
		expect(parseAmount('1.234', 'KWD', ',')).toEqual({
			ok: false,
			reason: 'ambiguous',
			message:
				'“1.234” can be read two ways: write 1234 without the point, or put decimals after a comma, e.g. 129,990.'
		});
		expect(parseAmount('129,999', 'EUR', ',')).toEqual({
			ok: false,
			reason: 'digits',
			message: 'EUR allows at most 2 decimals, e.g. 129,99.'
		});
		expect(parseAmount('158,5', 'JPY', ',')).toMatchObject({ ok: false, reason: 'digits' });
		// A comma never marks decimals where the region writes the point.
		expect(parseAmount('129,90', 'USD', '.')).toEqual({
			ok: false,
			reason: 'shape',
			message: 'Enter an amount in USD with digits and a point, e.g. 129.99.'
		});
		// Mixed conventions: US grouping in a comma region.
		expect(parseAmount('1,299.90', 'EUR', ',')).toEqual({
			ok: false,
			reason: 'shape',
			message: 'Enter an amount in EUR with digits and a comma, e.g. 129,99.'
		});
		for (const text of ['0x10', '1e3', '+5', '-5', '5 €', '1,29,90', '12.3.4', '.5', '5.', ''])
			expect(parseAmount(text, 'EUR', ','), text).toMatchObject({ ok: false, reason: 'shape' });
		expect(parseAmount('99999999999999999', 'USD')).toMatchObject({ ok: false });
	});

	it('writes minor units back as the plain decimal a form shows, without floats', () => {
		expect(minorToDecimal(12990, 'EUR')).toBe('129.90');
		expect(minorToDecimal(-500, 'USD')).toBe('-5.00');
		expect(minorToDecimal(1, 'KWD')).toBe('0.001');
		expect(minorToDecimal(15800, 'JPY')).toBe('15800');
		// 2^53 − 1 cents: a float division would print …740.99 only by luck; text is exact.
		expect(minorToDecimal(9007199254740991, 'USD')).toBe('90071992547409.91');
		expect(formatMoney(money(9007199254740991, 'USD'))).toBe('US$90,071,992,547,409.91');
	});
});
