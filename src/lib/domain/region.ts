/**
 * Region adjust (docs/architecture.md, Computations §2): re-prices a guide's slots for a reader's region.
 *
 * For every option (pick or alternate) of every slot:
 * - a quote from the target region wins: the line is `quoted`, dated by the quote;
 * - otherwise the base region's price is turned into an estimate: strip the base tax when
 *   that price includes it, convert through EUR cross rates, apply the target region's
 *   category factor, add the target tax when the target shows tax-inclusive prices. The line
 *   is `estimated`, dated by the exchange rate's as-of date;
 * - with neither a quote nor a usable base price (or no rate for a currency) it is `unpriced`
 *   and left out of totals, which count it instead of treating it as zero.
 *
 * Where rounding happens (the only places):
 * 1. An estimate is computed as one exact fraction of big integers (base price × tax factors
 *    × cross rate × category factor) and rounded ONCE, half-even, to the target currency's
 *    minor unit. No intermediate amount (net base price, EUR value) is rounded, so a chain of
 *    steps cannot add rounding errors together.
 * 2. A quoted price whose tax treatment differs from the region's display (a pre-tax store
 *    price in a tax-inclusive region) gets the tax added or removed, rounded half-even once.
 * 3. Line totals are unit price × quantity of the rounded unit price, so a line always equals
 *    what the reader sees per unit times the quantity; totals are exact sums (totals.ts).
 * Half-even is the rounding money.ts uses too: unbiased over many lines.
 *
 * Tax rates and category factors are integers in basis points (1900 = 19 %, 10400 = ×1.04);
 * exchange rates are decimal strings as the ECB publishes them. No float touches money.
 */
import {
	divideHalfEven,
	minorUnitsPerMajor,
	money,
	multiply,
	parseDecimal,
	ratioToDecimal
} from './money';
import type { ScaledDecimal } from './money';
import { listTotals } from './totals';
import type { Money, PartCategory, TaxMode } from './types';

const BP = 10_000n;

// ---------------------------------------------------------------------------------------------
// Exchange rates through EUR
// ---------------------------------------------------------------------------------------------

/** One published rate: units of the currency per 1 EUR, as a decimal string, and its date. */
export interface RateEntry {
	ratePerEur: string;
	/** YYYY-MM-DD, the day the reference rate was published for. */
	asOf: string;
}

/** Rates per EUR by ISO 4217 code. EUR itself is 1 by definition and need not be listed. */
export type RatesPerEur = Readonly<Record<string, RateEntry>>;

/** A needed exchange rate is missing from the table. */
export class MissingRateError extends RangeError {
	override readonly name = 'MissingRateError';
	constructor(readonly currency: string) {
		super(`No exchange rate per EUR for ${currency}`);
	}
}

interface ExactRate {
	/** to-units per from-unit = numerator / denominator, exactly. */
	numerator: bigint;
	denominator: bigint;
	/** The older as-of date of the rates involved; null when no rate was needed. */
	asOf: string | null;
}

function perEur(code: string, rates: RatesPerEur): { value: ScaledDecimal; asOf: string | null } {
	if (code === 'EUR') return { value: { units: 1n, scale: 0 }, asOf: null };
	const entry = rates[code];
	if (!entry) throw new MissingRateError(code);
	const value = parseDecimal(entry.ratePerEur);
	if (value.units === 0n) throw new RangeError(`Exchange rate for ${code} is zero`);
	return { value, asOf: entry.asOf };
}

function olderDate(a: string | null, b: string | null): string | null {
	if (a === null) return b;
	if (b === null) return a;
	return a < b ? a : b;
}

function exactRate(from: string, to: string, rates: RatesPerEur): ExactRate {
	if (from === to) return { numerator: 1n, denominator: 1n, asOf: null };
	const f = perEur(from, rates);
	const t = perEur(to, rates);
	// (t.units / 10^t.scale) / (f.units / 10^f.scale) = t.units · 10^f.scale / (f.units · 10^t.scale)
	return {
		numerator: t.value.units * 10n ** BigInt(f.value.scale),
		denominator: f.value.units * 10n ** BigInt(t.value.scale),
		asOf: olderDate(f.asOf, t.asOf)
	};
}

/** Decimal places of the cross-rate string returned by crossRate (display only). */
export const CROSS_RATE_DECIMALS = 10;

export interface CrossRate {
	from: string;
	to: string;
	/** Units of `to` per unit of `from`, rounded half-even to CROSS_RATE_DECIMALS decimals. */
	rate: string;
	/** Older as-of date of the two rates used; null when no rate was needed (same currency, or EUR alone). */
	asOf: string | null;
}

/**
 * The cross rate from one currency to another through EUR: (to per EUR) / (from per EUR),
 * e.g. USD→GBP on 2 Jan 2024 = 0.86645 / 1.0956.
 *
 * Precision: the ratio is computed exactly with big integers and only the returned string is
 * rounded, half-even, to CROSS_RATE_DECIMALS (10) decimal places: well beyond the 5 to 6
 * significant digits the ECB publishes. Conversions in this module never use the rounded
 * string; they use the exact ratio and round once at the target's minor unit.
 * Throws MissingRateError when a currency has no rate.
 */
export function crossRate(from: string, to: string, rates: RatesPerEur): CrossRate {
	const f = from.toUpperCase();
	const t = to.toUpperCase();
	const exact = exactRate(f, t, rates);
	return {
		from: f,
		to: t,
		rate: ratioToDecimal(exact.numerator, exact.denominator, CROSS_RATE_DECIMALS),
		asOf: exact.asOf
	};
}

/**
 * Converts through EUR cross rates with the exact ratio, rounding once, half-even, to the
 * target's minor unit. Throws MissingRateError when a currency has no rate.
 */
export function convertThroughEur(m: Money, to: string, rates: RatesPerEur): Money {
	const target = to.toUpperCase();
	const rate = exactRate(m.currency, target, rates);
	const amount = divideHalfEven(
		BigInt(m.amountMinor) * rate.numerator * minorUnitsPerMajor(target),
		rate.denominator * minorUnitsPerMajor(m.currency)
	);
	return money(Number(amount), target);
}

// ---------------------------------------------------------------------------------------------
// Tax in basis points
// ---------------------------------------------------------------------------------------------

function checkBp(value: number, what: string, max: number) {
	if (!Number.isSafeInteger(value) || value < 0 || value > max) {
		throw new RangeError(
			`${what} must be an integer number of basis points (0–${max}), got ${value}`
		);
	}
}

/** Net price plus tax, half-even at the minor unit: €100.00 at 1900 bp → €119.00. */
export function addTax(net: Money, taxRateBp: number): Money {
	checkBp(taxRateBp, 'Tax rate', 10_000);
	const gross = divideHalfEven(BigInt(net.amountMinor) * (BP + BigInt(taxRateBp)), BP);
	return money(Number(gross), net.currency);
}

/** Tax-inclusive price without its tax, half-even at the minor unit: €119.00 at 1900 bp → €100.00. */
export function stripTax(gross: Money, taxRateBp: number): Money {
	checkBp(taxRateBp, 'Tax rate', 10_000);
	const net = divideHalfEven(BigInt(gross.amountMinor) * BP, BP + BigInt(taxRateBp));
	return money(Number(net), gross.currency);
}

// ---------------------------------------------------------------------------------------------
// Region adjust
// ---------------------------------------------------------------------------------------------

/** What region adjust needs to know about a region. */
export interface RegionPricing {
	code: string;
	currency: string;
	taxMode: TaxMode;
	taxRateBp: number;
	/** Market factor per category in basis points (10400 = prices 4 % above the converted level); missing = 10000. */
	categoryFactorsBp: Partial<Record<PartCategory, number>>;
}

/** An observed price for one unit. */
export interface QuoteInput {
	unit: Money;
	/** Whether the amount includes the region's tax (VAT, GST, consumption tax). */
	taxIncluded: boolean;
	/** ISO 8601 date or timestamp of the observation. */
	observedAt: string;
	storeName?: string | null;
}

/** One option of a slot (the pick or an alternate) with its prices. */
export interface OptionInput {
	partId: number;
	/** Latest quote for this part in the target region, if any. */
	targetQuote: QuoteInput | null;
	/** The price in the guide's base region (normally its latest quote there), if any. */
	basePrice: QuoteInput | null;
}

export interface SlotInput {
	/** Caller's key for the slot (slot id or position), passed through. */
	key: string | number;
	category: PartCategory;
	quantity: number;
	pick: OptionInput;
	alternates: OptionInput[];
}

export type PriceStatus = 'quoted' | 'estimated' | 'unpriced';

/** How an estimate was made, so a page can show its working. */
export interface EstimateBasis {
	/** The base-region price the estimate starts from. */
	from: Money;
	/** Tax removed from the base price (0 when it was a pre-tax price). */
	baseTaxRemovedBp: number;
	/** Cross rate used, target units per base unit (display string, see crossRate). */
	rate: string;
	rateAsOf: string | null;
	factorBp: number;
	/** Tax added for a tax-inclusive target region (0 for a pre-tax region). */
	targetTaxAddedBp: number;
}

export interface PricedLine {
	partId: number;
	status: PriceStatus;
	/** Unit price in the target currency; null when unpriced. */
	unit: Money | null;
	/** quoted: the quote's date; estimated: the rate's as-of date (null when no conversion was needed). YYYY-MM-DD. */
	date: string | null;
	storeName: string | null;
	basis: EstimateBasis | null;
	/** A sentence for unpriced lines and for quotes whose tax treatment was changed. */
	note: string | null;
}

export interface AdjustedSlot {
	key: string | number;
	category: PartCategory;
	quantity: number;
	pick: PricedLine;
	/** pick unit × quantity, or null when the pick is unpriced. */
	lineTotal: Money | null;
	alternates: PricedLine[];
}

export interface RegionAdjustment {
	region: string;
	currency: string;
	taxMode: TaxMode;
	slots: AdjustedSlot[];
	picksTotal: Money | null;
	unpricedSlots: number;
	/** Cheapest and dearest totals over each slot's pick and alternates. */
	range: { min: Money; max: Money } | null;
	/** How the picks were priced. */
	picks: Record<PriceStatus, number>;
	/** Oldest rate date any estimate used (for a "rates as of" label); null when none was needed. */
	oldestRateAsOf: string | null;
}

export interface AdjustInput {
	base: RegionPricing;
	target: RegionPricing;
	slots: SlotInput[];
	rates: RatesPerEur;
}

function dateOnly(isoDateOrTime: string): string {
	return isoDateOrTime.slice(0, 10);
}

function unpriced(partId: number, note: string): PricedLine {
	return { partId, status: 'unpriced', unit: null, date: null, storeName: null, basis: null, note };
}

function quotedLine(partId: number, quote: QuoteInput, target: RegionPricing): PricedLine {
	if (quote.unit.currency !== target.currency) {
		throw new TypeError(
			`A quote in region ${target.code} must be in ${target.currency}, got ${quote.unit.currency}`
		);
	}
	const wantsTax = target.taxMode === 'inclusive';
	let unit = quote.unit;
	let note: string | null = null;
	if (wantsTax && !quote.taxIncluded && target.taxRateBp > 0) {
		unit = addTax(unit, target.taxRateBp);
		note = 'Tax added to the store’s pre-tax price.';
	} else if (!wantsTax && quote.taxIncluded && target.taxRateBp > 0) {
		unit = stripTax(unit, target.taxRateBp);
		note = 'Tax removed from the store’s tax-inclusive price.';
	}
	return {
		partId,
		status: 'quoted',
		unit,
		date: dateOnly(quote.observedAt),
		storeName: quote.storeName ?? null,
		basis: null,
		note
	};
}

function estimatedLine(
	partId: number,
	category: PartCategory,
	price: QuoteInput,
	base: RegionPricing,
	target: RegionPricing,
	rates: RatesPerEur
): PricedLine {
	let rate: ExactRate;
	try {
		rate = exactRate(price.unit.currency, target.currency, rates);
	} catch (e) {
		if (e instanceof MissingRateError) {
			return unpriced(partId, `No exchange rate for ${e.currency}, so no estimate can be made.`);
		}
		throw e;
	}
	const baseTaxRemovedBp = price.taxIncluded ? base.taxRateBp : 0;
	const targetTaxAddedBp = target.taxMode === 'inclusive' ? target.taxRateBp : 0;
	const factorBp = target.categoryFactorsBp[category] ?? 10_000;
	checkBp(baseTaxRemovedBp, 'Base tax rate', 10_000);
	checkBp(targetTaxAddedBp, 'Target tax rate', 10_000);
	checkBp(factorBp, `Category factor for ${category}`, 1_000_000);

	// One exact fraction, one rounding (see the header):
	// amount × 10000/(10000+baseTax) × rate × perMajor(to)/perMajor(from) × factor/10000 × (10000+targetTax)/10000
	const numerator =
		BigInt(price.unit.amountMinor) *
		BP *
		rate.numerator *
		minorUnitsPerMajor(target.currency) *
		BigInt(factorBp) *
		(BP + BigInt(targetTaxAddedBp));
	const denominator =
		(BP + BigInt(baseTaxRemovedBp)) *
		rate.denominator *
		minorUnitsPerMajor(price.unit.currency) *
		BP *
		BP;
	const unit = money(Number(divideHalfEven(numerator, denominator)), target.currency);
	return {
		partId,
		status: 'estimated',
		unit,
		date: rate.asOf,
		storeName: null,
		basis: {
			from: price.unit,
			baseTaxRemovedBp,
			rate: ratioToDecimal(rate.numerator, rate.denominator, CROSS_RATE_DECIMALS),
			rateAsOf: rate.asOf,
			factorBp,
			targetTaxAddedBp
		},
		note: null
	};
}

/** Prices one option in the target region: quoted, else estimated, else unpriced. */
export function priceOption(
	option: OptionInput,
	category: PartCategory,
	base: RegionPricing,
	target: RegionPricing,
	rates: RatesPerEur
): PricedLine {
	if (option.targetQuote) return quotedLine(option.partId, option.targetQuote, target);
	if (option.basePrice)
		return estimatedLine(option.partId, category, option.basePrice, base, target, rates);
	return unpriced(
		option.partId,
		`No price in ${target.code.toUpperCase()} and none in the guide’s region to estimate from.`
	);
}

/**
 * Re-prices every slot for the target region and totals the picks and the min–max range
 * over alternates (totals.ts). Pure: the caller loads quotes, regions and rates.
 */
export function adjustToRegion({ base, target, slots, rates }: AdjustInput): RegionAdjustment {
	const picks: Record<PriceStatus, number> = { quoted: 0, estimated: 0, unpriced: 0 };
	let oldestRateAsOf: string | null = null;
	const adjusted: AdjustedSlot[] = slots.map((slot) => {
		const price = (o: OptionInput) => priceOption(o, slot.category, base, target, rates);
		const pick = price(slot.pick);
		const alternates = slot.alternates.map(price);
		picks[pick.status] += 1;
		for (const line of [pick, ...alternates]) {
			if (line.status === 'estimated') oldestRateAsOf = olderDate(oldestRateAsOf, line.date);
		}
		return {
			key: slot.key,
			category: slot.category,
			quantity: slot.quantity,
			pick,
			lineTotal: pick.unit ? multiply(pick.unit, slot.quantity) : null,
			alternates
		};
	});
	const totals = listTotals(
		adjusted.map((s) => ({
			quantity: s.quantity,
			pick: s.pick.unit,
			alternates: s.alternates.map((a) => a.unit)
		})),
		target.currency
	);
	return {
		region: target.code,
		currency: target.currency,
		taxMode: target.taxMode,
		slots: adjusted,
		picksTotal: totals.picksTotal,
		unpricedSlots: totals.unpricedSlots,
		range: totals.range,
		picks,
		oldestRateAsOf
	};
}
