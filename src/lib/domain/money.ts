/**
 * Money arithmetic on integer minor units with ISO 4217 exponents, built on dinero.js v2.
 *
 * Rounding choice: half-even ("banker's rounding") when a conversion or a percentage
 * produces more digits than the currency's minor unit allows. Half-even is unbiased
 * over many lines, so totals of converted lines do not drift upward.
 */
import { add, allocate, convert, dinero, halfEven, toSnapshot, transformScale } from 'dinero.js';
import type { Dinero, DineroCurrency as Currency } from 'dinero.js';
import * as currencies from 'dinero.js/currencies';
import type { Money } from './types';

const CURRENCIES = currencies as unknown as Record<string, Currency<number>>;

/** The ISO 4217 currency record (code, base, exponent), or an error for unknown codes. */
export function currencyOf(code: string): Currency<number> {
	const currency = CURRENCIES[code.toUpperCase()];
	if (!currency) throw new RangeError(`Unknown ISO 4217 currency code: ${code}`);
	// MGA and MRU divide into fifths; ISO lists them with 2 digits. Amounts here are
	// decimal minor units, so those two are refused rather than priced wrongly.
	if (currency.base !== 10)
		throw new RangeError(`${code} has non-decimal subunits, which Slotwise does not price`);
	return currency;
}

/** Number of minor-unit digits (ISO 4217 exponent): JPY 0, USD 2, KWD 3. */
export function minorUnitDigits(code: string): number {
	return currencyOf(code).exponent;
}

export function money(amountMinor: number, currency: string): Money {
	if (!Number.isSafeInteger(amountMinor)) {
		throw new RangeError(`Money must be an integer number of minor units, got ${amountMinor}`);
	}
	return { amountMinor, currency: currency.toUpperCase() };
}

function toDinero(m: Money): Dinero<number> {
	return dinero({ amount: m.amountMinor, currency: currencyOf(m.currency) });
}

function fromDinero(d: Dinero<number>): Money {
	const snap = toSnapshot(d);
	const rounded =
		snap.scale === snap.currency.exponent
			? snap
			: toSnapshot(transformScale(d, snap.currency.exponent, halfEven));
	return { amountMinor: rounded.amount, currency: rounded.currency.code };
}

/** Sum of amounts in one currency; mixing currencies is a programming error. */
export function sum(items: Money[], currency: string): Money {
	let total = toDinero(money(0, currency));
	for (const item of items) {
		if (item.currency !== total.toJSON().currency.code) {
			throw new TypeError(`Cannot add ${item.currency} to ${currency} without conversion`);
		}
		total = add(total, toDinero(item));
	}
	return fromDinero(total);
}

export function multiply(m: Money, quantity: number): Money {
	if (!Number.isInteger(quantity) || quantity < 0) {
		throw new RangeError(`Quantity must be a non-negative integer, got ${quantity}`);
	}
	return money(m.amountMinor * quantity, m.currency);
}

export function subtract(a: Money, b: Money): Money {
	if (a.currency !== b.currency) throw new TypeError('Cannot subtract different currencies');
	return money(a.amountMinor - b.amountMinor, a.currency);
}

/**
 * Converts with a rate given as a decimal string ("1.0956" = 1 unit of `from` buys
 * 1.0956 of `to`), rounding half-even to the target currency's minor unit.
 * Decimal strings avoid binary floating point errors in the rate itself.
 */
export function convertAt(m: Money, to: string, rate: string): Money {
	const match = /^(\d+)(?:\.(\d+))?$/.exec(rate.trim());
	if (!match) throw new RangeError(`Rate must be a positive decimal string, got "${rate}"`);
	const fraction = match[2] ?? '';
	const amount = Number(`${match[1]}${fraction}`);
	if (!Number.isSafeInteger(amount) || amount === 0)
		throw new RangeError(`Unusable rate "${rate}"`);
	const target = currencyOf(to);
	const converted = convert(toDinero(m), target, {
		[target.code]: { amount, scale: fraction.length }
	});
	return fromDinero(converted);
}

/** Splits an amount into parts by ratios without losing a minor unit. */
export function split(m: Money, ratios: number[]): Money[] {
	return allocate(toDinero(m), ratios).map(fromDinero);
}

/** Locale formatting for display; amounts stay integers until this point. */
export function formatMoney(m: Money, locale = 'en-GB'): string {
	const digits = minorUnitDigits(m.currency);
	return new Intl.NumberFormat(locale, {
		style: 'currency',
		currency: m.currency,
		minimumFractionDigits: digits,
		maximumFractionDigits: digits
	}).format(m.amountMinor / 10 ** digits);
}

/** Signed formatting for deltas ("+€12.00", "−€5.50"). */
export function formatDelta(m: Money, locale = 'en-GB'): string {
	if (m.amountMinor === 0) return `±${formatMoney(m, locale)}`;
	const abs = formatMoney(money(Math.abs(m.amountMinor), m.currency), locale);
	return m.amountMinor > 0 ? `+${abs}` : `\u2212${abs}`;
}
