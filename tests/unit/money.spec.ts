import { describe, expect, it } from 'vitest';
import { convertAt, formatMoney, minorUnitDigits, money, multiply, sum } from '$lib/domain/money';

/*
 * Sources (docs/sources.md):
 * 10a ISO 4217 List One, maintenance agency SIX, published 2024-06-25 (V).
 * 10c ECB euro foreign exchange reference rates for 2 Jan 2024 (V).
 * 10d worked conversions with dinero.js 2.0.2, half-even (D).
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
