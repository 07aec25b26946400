/**
 * Tips from readers to guide authors (issue 20): amounts, limits, the ledger's status rule and
 * the earnings summary. Pure: no framework, database or provider.
 *
 * Amounts are integer minor units of an ISO 4217 currency, as everywhere in Slotwise.
 */
import {
	formatMoney,
	minorUnitDigits,
	minorUnitsPerMajor,
	money,
	parseDecimal,
	subtract,
	sum
} from './money';
import type { Money } from './types';

export const TIP_STATUSES = ['pending', 'failed', 'paid', 'refunded'] as const;
export type TipStatus = (typeof TIP_STATUSES)[number];

/*
 * The ledger's one rule: a status only moves forward in this order. A late "payment failed"
 * after "paid", or a redelivered "paid" after "refunded", then changes nothing, so the order
 * in which the provider's events arrive does not matter. (A declined card followed by a
 * successful retry on the same checkout is failed → paid: forward too.)
 */
const RANK: Record<TipStatus, number> = { pending: 0, failed: 1, paid: 2, refunded: 3 };

/**
 * The statuses a row may be in for `to` to be a forward move. Even "refunded" may come
 * straight from "pending": if the provider's refund event overtakes its payment events, the
 * late "paid" must not bring the money back into the author's totals.
 */
export function statusesBefore(to: TipStatus): TipStatus[] {
	return TIP_STATUSES.filter((s) => RANK[s] < RANK[to]);
}

export interface TipLimits {
	minMinor: number;
	maxMinor: number;
	/** The one-click amounts offered on the tip form. */
	presetsMinor: number[];
}

/*
 * Per-currency limits, in minor units. The minimums sit above the provider's documented
 * minimum charge amounts (USD 0.50, EUR 0.50, GBP 0.30, JPY 50; from memory of the
 * provider's "minimum and maximum charge amounts" table), so a tip is never refused there;
 * the maximums and presets are our own choice (common practice, no published source): a
 * thank-you, not a purchase. Only the currencies of Slotwise's regions are listed; any other
 * currency takes no tips until it is added here.
 */
const LIMITS: Record<string, TipLimits> = {
	USD: { minMinor: 100, maxMinor: 20_000, presetsMinor: [300, 500, 1_000] },
	EUR: { minMinor: 100, maxMinor: 20_000, presetsMinor: [300, 500, 1_000] },
	GBP: { minMinor: 100, maxMinor: 20_000, presetsMinor: [300, 500, 1_000] },
	JPY: { minMinor: 100, maxMinor: 30_000, presetsMinor: [500, 1_000, 2_000] }
};

export function tipLimits(currency: string): TipLimits | null {
	return LIMITS[currency.toUpperCase()] ?? null;
}

/** "Between €1.00 and €200.00", for the form and for refusals. */
export function describeLimits(currency: string): string {
	const limits = tipLimits(currency);
	if (!limits) return `Tips in ${currency} are not available.`;
	return `Between ${formatMoney(money(limits.minMinor, currency))} and ${formatMoney(money(limits.maxMinor, currency))}.`;
}

export type AmountResult = { ok: true; amountMinor: number } | { ok: false; message: string };

/**
 * A typed amount in major units ("5", "5.50", "5,50") as minor units of `currency`. Refuses
 * more decimals than the currency has (a yen has none), signs, exponents and separators.
 */
export function parseMajorAmount(text: string, currency: string): AmountResult {
	const clean = text.trim().replace(',', '.');
	let parsed;
	try {
		parsed = parseDecimal(clean);
	} catch {
		return { ok: false, message: 'Enter an amount such as 5 or 7.50, digits only.' };
	}
	const digits = minorUnitDigits(currency);
	if (parsed.scale > digits) {
		return {
			ok: false,
			message:
				digits === 0
					? `${currency} has no smaller unit: enter a whole number.`
					: `${currency} has ${digits} decimal places at most.`
		};
	}
	const minor = (parsed.units * minorUnitsPerMajor(currency)) / 10n ** BigInt(parsed.scale);
	if (minor > BigInt(Number.MAX_SAFE_INTEGER))
		return { ok: false, message: 'That amount is too large.' };
	return { ok: true, amountMinor: Number(minor) };
}

/** Plain major-unit text for files ("5.00", "1000"): no symbol, no grouping. */
export function majorText(m: Money): string {
	const digits = minorUnitDigits(m.currency);
	if (digits === 0) return String(m.amountMinor);
	const text = String(m.amountMinor).padStart(digits + 1, '0');
	return `${text.slice(0, -digits)}.${text.slice(-digits)}`;
}

/** null when `amountMinor` is within the currency's limits, else the message to show. */
export function amountProblem(amountMinor: number, currency: string): string | null {
	const limits = tipLimits(currency);
	if (!limits) return `Tips in ${currency} are not available.`;
	if (amountMinor < limits.minMinor || amountMinor > limits.maxMinor)
		return `Tips are ${describeLimits(currency).toLowerCase().replace(/\.$/, '')}.`;
	return null;
}

/** The calendar month of a moment, in UTC, as "2026-12". */
export function monthOf(at: Date): string {
	return at.toISOString().slice(0, 7);
}

export interface LedgerLine {
	guideTitle: string;
	paidAt: Date;
	amount: Money;
	/** The provider's fee; null when it never told us (counted as 0, flagged by `feeUnknown`). */
	fee: Money | null;
}

export interface EarningsRow {
	guideTitle: string;
	month: string;
	currency: string;
	count: number;
	gross: Money;
	fee: Money;
	net: Money;
	feeUnknown: boolean;
}

export interface EarningsTotal {
	currency: string;
	count: number;
	gross: Money;
	fee: Money;
	net: Money;
}

/**
 * Paid tips per guide, month and currency, and totals per currency. Currencies are never
 * added together: a reader in Japan and one in Germany give two totals.
 */
export function summarizeEarnings(lines: LedgerLine[]): {
	rows: EarningsRow[];
	totals: EarningsTotal[];
} {
	const groups = new Map<string, LedgerLine[]>();
	for (const line of lines) {
		const key = JSON.stringify([monthOf(line.paidAt), line.guideTitle, line.amount.currency]);
		groups.set(key, [...(groups.get(key) ?? []), line]);
	}
	const rows: EarningsRow[] = [...groups.entries()].map(([key, group]) => {
		const [month, guideTitle, currency] = JSON.parse(key) as [string, string, string];
		return { guideTitle, month, currency, count: group.length, ...amounts(group, currency) };
	});
	rows.sort(
		(a, b) =>
			b.month.localeCompare(a.month) ||
			a.guideTitle.localeCompare(b.guideTitle) ||
			a.currency.localeCompare(b.currency)
	);
	const currencies = [...new Set(lines.map((l) => l.amount.currency))].sort();
	const totals = currencies.map((currency) => {
		const group = lines.filter((l) => l.amount.currency === currency);
		const { gross, fee, net } = amounts(group, currency);
		return { currency, count: group.length, gross, fee, net };
	});
	return { rows, totals };
}

function amounts(group: LedgerLine[], currency: string) {
	const gross = sum(
		group.map((l) => l.amount),
		currency
	);
	const fee = sum(
		group.map((l) => l.fee ?? money(0, currency)),
		currency
	);
	return { gross, fee, net: subtract(gross, fee), feeUnknown: group.some((l) => !l.fee) };
}
