/**
 * Money, in one module: integer minor units with ISO 4217 exponents (arithmetic on
 * dinero.js v2), the exact big-integer decimal helpers the pricing computations share, and
 * the only conversions between typed decimal text and minor units (parseAmount for input,
 * minorToDecimal for a form's value, formatMoney for display). No float ever holds an
 * amount: text is split into digits, and display formats the decimal string itself.
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

/**
 * Formatters by locale and currency. Building an Intl.NumberFormat costs about a hundred
 * formats, and a guide page formats dozens of amounts, so each is built once per process.
 * The set of locales × currencies is small (regions are few), so the cache stays tiny.
 */
const moneyFormatters = new Map<string, Intl.NumberFormat>();

function moneyFormatter(locale: string, currency: string, digits: number): Intl.NumberFormat {
	const key = `${locale}|${currency}`;
	let formatter = moneyFormatters.get(key);
	if (!formatter) {
		formatter = new Intl.NumberFormat(locale, {
			style: 'currency',
			currency,
			minimumFractionDigits: digits,
			maximumFractionDigits: digits
		});
		moneyFormatters.set(key, formatter);
	}
	return formatter;
}

/**
 * Locale formatting for display; amounts stay integers until this point. Intl formats the
 * exact decimal string (never a float), so amounts past 2^53 / 10^digits stay exact too.
 */
export function formatMoney(m: Money, locale = 'en-GB'): string {
	const digits = minorUnitDigits(m.currency);
	return moneyFormatter(locale, m.currency, digits).format(
		minorToDecimal(m.amountMinor, m.currency) as Intl.StringNumericLiteral
	);
}

/** Signed formatting for deltas ("+€12.00", "−€5.50"). */
export function formatDelta(m: Money, locale = 'en-GB'): string {
	if (m.amountMinor === 0) return `±${formatMoney(m, locale)}`;
	const abs = formatMoney(money(Math.abs(m.amountMinor), m.currency), locale);
	return m.amountMinor > 0 ? `+${abs}` : `\u2212${abs}`;
}

// ---------------------------------------------------------------------------------------------
// Exact decimal helpers (big integers; region.ts, value.ts and reproducibility.ts use them)
// ---------------------------------------------------------------------------------------------

/** A non-negative decimal as an integer and a power-of-ten scale: "1.0956" → 10956n / 10^4. */
export interface ScaledDecimal {
	units: bigint;
	scale: number;
}

const DECIMAL = /^(\d{1,30})(?:\.(\d{1,30}))?$/;

/** Parses a plain decimal string ("1.0956", "382.10", "155.68"); no signs, exponents or commas. */
export function parseDecimal(text: string): ScaledDecimal {
	const match = DECIMAL.exec(text.trim());
	if (!match) throw new RangeError(`Not a plain decimal number: "${text}"`);
	const fraction = match[2] ?? '';
	return { units: BigInt(`${match[1]}${fraction}`), scale: fraction.length };
}

/**
 * numerator / denominator rounded half-even to an integer (exact halves go to the even
 * neighbour; everything else to the nearest). Works for negative numerators too.
 */
export function divideHalfEven(numerator: bigint, denominator: bigint): bigint {
	if (denominator === 0n) throw new RangeError('Division by zero');
	if (denominator < 0n) return divideHalfEven(-numerator, -denominator);
	const negative = numerator < 0n;
	const n = negative ? -numerator : numerator;
	let q = n / denominator;
	const twiceRemainder = 2n * (n - q * denominator);
	if (twiceRemainder > denominator || (twiceRemainder === denominator && q % 2n === 1n)) q += 1n;
	return negative ? -q : q;
}

/** The exact value numerator / denominator as a decimal string with at most `digits` decimals (half-even). */
export function ratioToDecimal(numerator: bigint, denominator: bigint, digits: number): string {
	const scaled = divideHalfEven(numerator * 10n ** BigInt(digits), denominator);
	const negative = scaled < 0n;
	const text = (negative ? -scaled : scaled).toString().padStart(digits + 1, '0');
	const whole = text.slice(0, text.length - digits);
	const fraction = text.slice(text.length - digits).replace(/0+$/, '');
	return `${negative ? '-' : ''}${whole}${fraction ? `.${fraction}` : ''}`;
}

/**
 * Minor units in one major unit: 100 for USD, 1 for JPY, 1000 for KWD. Taken as
 * base^exponent from dinero's ISO 4217 records, so the two non-decimal currencies (MGA, MRU:
 * base 5) are handled correctly too.
 */
export function minorUnitsPerMajor(code: string): bigint {
	const { base, exponent } = currencyOf(code);
	if (typeof base !== 'number') throw new RangeError(`Currency ${code} has several bases`);
	return BigInt(base) ** BigInt(exponent);
}

// ---------------------------------------------------------------------------------------------
// Typed amounts: decimal text ↔ minor units
// ---------------------------------------------------------------------------------------------

/** The mark that separates whole units from the fraction where a region writes amounts. */
export type DecimalMark = '.' | ',';

const markCache = new Map<string, DecimalMark>();

/**
 * How a region writes the decimal mark, from Unicode CLDR's number symbols for the region's
 * most likely locale (docs/sources.md 10e): "de" → "," (129,90 €), "us", "uk", "jp" → ".".
 * Region codes that are not ISO 3166 country codes (an editor may create "latam") and
 * regions whose locale uses another mark (Arabic "٫") write the point, which every region
 * accepts anyway.
 */
export function decimalMarkOf(regionCode: string): DecimalMark {
	const code = regionCode.trim().toUpperCase();
	const known = markCache.get(code);
	if (known) return known;
	let mark: DecimalMark = '.';
	if (/^[A-Z]{2}$/.test(code)) {
		try {
			const locale = new Intl.Locale('und', { region: code }).maximize().toString();
			const decimal = new Intl.NumberFormat(locale)
				.formatToParts(1.5)
				.find((part) => part.type === 'decimal')?.value;
			if (decimal === ',') mark = ',';
		} catch {
			// Not a region Intl knows: the point.
		}
	}
	markCache.set(code, mark);
	return mark;
}

export type AmountParse =
	| { ok: true; amountMinor: number }
	| {
			ok: false;
			/** shape: not an amount; digits: more decimals than the currency has; ambiguous: could be read two ways; too_large. */
			reason: 'shape' | 'digits' | 'ambiguous' | 'too_large';
			message: string;
	  };

/** Digits, optionally in groups of three, with an optional fraction: the widest form any region writes. */
const AMOUNT_SHAPE = /^(?:\d{1,15}|\d{1,3}(?:[.,\u0020\u00a0\u202f]\d{3})+)(?:[.,]\d{1,15})?$/;

/**
 * Whether text could be an amount in some region (digits, grouping, one decimal mark; no
 * sign, exponent or currency symbol). Schemas check this much; what the text means needs
 * the region and its currency, which parseAmount gets from the service.
 */
export function looksLikeAmount(text: string): boolean {
	return text.trim().length <= 24 && AMOUNT_SHAPE.test(text.trim());
}

/** Grouping marks: the point or a space where the decimal mark is the comma, else the comma. */
const GROUPS: Record<DecimalMark, string> = { ',': '.\u0020\u00a0\u202f', '.': ',' };

function example(digits: number, mark: DecimalMark): string {
	return digits === 0 ? '15800' : `129${mark}${'99'.padEnd(digits, '0').slice(0, digits)}`;
}

/**
 * Typed decimal text → integer minor units of `currency` (ISO 4217 exponent: JPY 0, USD 2,
 * KWD 3; docs/sources.md 10a), read the way a region with decimal mark `mark` writes it:
 *
 * - Every region accepts the plain form the API documents: digits and a point ("1299.90").
 * - A point region (mark ".") also takes comma groups of three: "1,299.90". "129,90" is
 *   refused, since the comma there never marks decimals.
 * - A comma region (mark ",") also takes "129,90" and groups of three split by points or
 *   spaces: "1.299,90", "1 299,90". A single point followed by exactly three digits
 *   ("1.299") is refused: it is 1299 to a reader of the region and 1.299 in the plain
 *   form, and guessing could turn a price into a thousandth of itself. The message says
 *   "too many decimals" when the plain reading has more than the currency allows (EUR),
 *   else that the text can be read two ways (KWD).
 * - More decimals than the currency has are refused rather than rounded: a typo must not
 *   become a price. Signs, exponents and currency symbols are refused.
 */
export function parseAmount(text: string, currency: string, mark: DecimalMark = '.'): AmountParse {
	const digits = minorUnitDigits(currency);
	const code = currency.toUpperCase();
	const trimmed = text.trim();
	const shape: AmountParse = {
		ok: false,
		reason: 'shape',
		message: `Enter an amount in ${code} with digits and a ${mark === ',' ? 'comma' : 'point'}, e.g. ${example(digits, mark)}.`
	};
	if (!looksLikeAmount(trimmed)) return shape;
	const groups = GROUPS[mark];
	/** Plain digits, or groups of three split by one of this region's group marks; else null. */
	const grouped = (s: string): string | null => {
		if (/^\d+$/.test(s)) return s;
		const used = [...new Set(s.replace(/\d/g, ''))];
		if (used.length !== 1 || !groups.includes(used[0] as string)) return null;
		const parts = s.split(used[0] as string);
		return /^\d{1,3}$/.test(parts[0] ?? '') && parts.slice(1).every((p) => /^\d{3}$/.test(p))
			? parts.join('')
			: null;
	};
	let whole: string | null;
	let fraction = '';
	const last = Math.max(trimmed.lastIndexOf('.'), trimmed.lastIndexOf(','));
	if (last < 0) whole = grouped(trimmed);
	else {
		const sep = trimmed[last] as string;
		const before = trimmed.slice(0, last);
		// Read as groups only ("1.299" in a comma region, "1,299" in a point region) …
		const asGroups = grouped(trimmed);
		// … or with `sep` as the decimal mark: the region's own (whole part may be grouped), or
		// the plain form's point (whole part plain digits).
		const asDecimal =
			sep === mark ? grouped(before) : sep === '.' && /^\d+$/.test(before) ? before : null;
		if (asGroups !== null && asDecimal !== null) {
			// Refused either way. When the decimal reading has more decimals than the currency,
			// that is the reason given (as for the plain form anywhere), with the other reading.
			const tail = trimmed.length - last - 1;
			return tail > digits
				? {
						ok: false,
						reason: 'digits',
						message: `${code} allows at most ${digits} decimal${digits === 1 ? '' : 's'}, e.g. ${example(digits, mark)}; for ${asGroups} write ${asGroups} without the point.`
					}
				: {
						ok: false,
						reason: 'ambiguous',
						message: `“${trimmed}” can be read two ways: write ${asGroups} without the point, or put decimals after a comma, e.g. ${example(digits, ',')}.`
					};
		}
		whole = asGroups ?? asDecimal;
		if (asGroups === null) fraction = trimmed.slice(last + 1);
	}
	if (whole === null) return shape;
	if (fraction.length > digits) {
		return {
			ok: false,
			reason: 'digits',
			message:
				digits === 0
					? `${code} has no minor unit: enter a whole amount, e.g. ${example(0, mark)}.`
					: `${code} allows at most ${digits} decimal${digits === 1 ? '' : 's'}, e.g. ${example(digits, mark)}.`
		};
	}
	const amountMinor = Number(whole + fraction.padEnd(digits, '0'));
	if (whole.length > 15 || !Number.isSafeInteger(amountMinor))
		return { ok: false, reason: 'too_large', message: 'That amount is too large.' };
	return { ok: true, amountMinor };
}

/**
 * Minor units → the plain decimal text a form shows and the API answers, in the currency's
 * digits: 12999 USD → "129.99", 77838 JPY → "77838", 1234 KWD → "1.234", −500 USD → "-5.00".
 * String arithmetic only (no float), so every amount Money can hold comes back exactly.
 */
export function minorToDecimal(amountMinor: number, currency: string): string {
	if (!Number.isSafeInteger(amountMinor))
		throw new RangeError(`Money must be an integer number of minor units, got ${amountMinor}`);
	const digits = minorUnitDigits(currency);
	const sign = amountMinor < 0 ? '-' : '';
	const text = String(Math.abs(amountMinor)).padStart(digits + 1, '0');
	return digits === 0
		? `${sign}${text}`
		: `${sign}${text.slice(0, -digits)}.${text.slice(-digits)}`;
}
