/**
 * Exchange rates: the ECB's daily euro reference rates, stored per currency and as-of date.
 * The only module that reads or writes FxRate rows; returns plain objects.
 */
import { Op, fn, col } from 'sequelize';
import type { RatesPerEur } from '$lib/domain/region';
import { FxRate, sequelize } from '$lib/server/db';
import { fetchEcbDailyRates, type FetchOptions } from '$lib/server/fx/ecb';
import { cached } from './reference-cache';
import { bumpGuideViews } from './cache-generations';
import * as guidePrices from './guide-prices';

/** Rates older than this many days are flagged stale on pages (DESIGN: "older than 7 days"). */
export const STALE_AFTER_DAYS = 7;

const DAY_MS = 86_400_000;
const MONTHS = [
	'January',
	'February',
	'March',
	'April',
	'May',
	'June',
	'July',
	'August',
	'September',
	'October',
	'November',
	'December'
];

/** "ECB euro foreign exchange reference rates, 2 January 2024" for as-of 2024-01-02. */
export function ecbSource(asOf: string): string {
	const [y, m, d] = asOf.split('-').map(Number);
	return `ECB euro foreign exchange reference rates, ${d} ${MONTHS[(m ?? 1) - 1]} ${y}`;
}

/** DECIMAL(18, 6) comes back as "1.095600": drop the padding so rates compare and read as published ("382.1"). */
export function normalizeRate(rate: string): string {
	const [whole = '0', fraction = ''] = String(rate).split('.');
	const trimmed = fraction.replace(/0+$/, '');
	return `${whole.replace(/^0+(?=\d)/, '')}${trimmed ? `.${trimmed}` : ''}`;
}

/** Whole days from an as-of date (UTC midnight) to now; never negative. */
export function rateAgeDays(asOf: string, now: Date): number {
	return Math.max(0, Math.floor((now.getTime() - Date.parse(`${asOf}T00:00:00Z`)) / DAY_MS));
}

export interface RefreshResult {
	asOf: string;
	source: string;
	/** Currencies that had no row for this as-of date. */
	created: string[];
	/** Currencies whose stored rate for this date differed (the ECB corrects a rate now and then). */
	updated: { currency: string; from: string; to: string }[];
	unchanged: string[];
}

/**
 * Fetches the ECB's daily file (ECB_RATES_URL) and upserts one row per currency and as-of
 * date in one transaction: all of the day's rates are stored, or none.
 * Throws EcbRatesError when the file cannot be fetched or read; nothing is written then.
 */
export async function refresh(options: FetchOptions = {}): Promise<RefreshResult> {
	const daily = await fetchEcbDailyRates(options);
	const source = ecbSource(daily.asOf);
	const result = await sequelize.transaction(async (transaction) => {
		// A plain read (no FOR UPDATE): its gap locks would make two concurrent refreshes of a
		// new day deadlock. The write below is atomic by itself; the diff is for the report.
		const existing = await FxRate.findAll({ where: { asOf: daily.asOf }, transaction });
		const stored = new Map(existing.map((r) => [r.currency, normalizeRate(r.ratePerEur)]));
		const result: RefreshResult = {
			asOf: daily.asOf,
			source,
			created: [],
			updated: [],
			unchanged: []
		};
		const currencies = Object.keys(daily.rates).sort();
		for (const currency of currencies) {
			const rate = normalizeRate(daily.rates[currency] as string);
			const before = stored.get(currency);
			if (before === undefined) result.created.push(currency);
			else if (before !== rate) result.updated.push({ currency, from: before, to: rate });
			else result.unchanged.push(currency);
		}
		// One statement, atomic per row: a concurrent refresh of the same day cannot hit the
		// unique key (currency, as_of) and fail half-way.
		await FxRate.bulkCreate(
			currencies.map((currency) => ({
				currency,
				asOf: daily.asOf,
				ratePerEur: daily.rates[currency] as string,
				source
			})),
			{ updateOnDuplicate: ['ratePerEur', 'source', 'updatedAt'], transaction }
		);
		return result;
	});
	// Every estimate across currencies may move. Guide pages price live: their cached views
	// go at once, in every app process. The stored list figures of all guides are re-stored
	// after the answer (the pass grows with the number of guides; refreshes coalesce).
	if (result.created.length > 0 || result.updated.length > 0) {
		await bumpGuideViews();
		guidePrices.refreshAllLater();
	}
	return result;
}

export interface FxRateView {
	currency: string;
	/** Units per 1 EUR, as published (trailing zeros dropped). */
	ratePerEur: string;
	asOf: string;
	source: string;
	ageDays: number;
	/** Older than STALE_AFTER_DAYS days at `now`. */
	stale: boolean;
}

/** The newest stored rate of every currency, by code, with its age and stale flag at `now`. */
export async function latest(now: Date = new Date()): Promise<FxRateView[]> {
	const newest = (await FxRate.findAll({
		attributes: ['currency', [fn('MAX', col('as_of')), 'asOf']],
		group: ['currency'],
		raw: true
	})) as unknown as { currency: string; asOf: string | Date }[];
	if (newest.length === 0) return [];
	const rows = await FxRate.findAll({
		where: {
			[Op.or]: newest.map((n) => ({
				currency: n.currency,
				asOf:
					n.asOf instanceof Date ? n.asOf.toISOString().slice(0, 10) : String(n.asOf).slice(0, 10)
			}))
		},
		order: [['currency', 'ASC']]
	});
	return rows.map((r) => {
		const ageDays = rateAgeDays(r.asOf, now);
		return {
			currency: r.currency,
			ratePerEur: normalizeRate(r.ratePerEur),
			asOf: r.asOf,
			source: r.source,
			ageDays,
			stale: ageDays > STALE_AFTER_DAYS
		};
	});
}

/** The newest rates in the shape region adjust takes (src/lib/domain/region.ts). */
export function ratesForPricing(): Promise<RatesPerEur> {
	// Read on every cross-region price; changes only on a refresh (reference-cache.ts).
	return cached('fx-rates-for-pricing', loadRatesForPricing);
}

async function loadRatesForPricing(): Promise<RatesPerEur> {
	const rates: Record<string, { ratePerEur: string; asOf: string }> = {};
	for (const r of await latest()) rates[r.currency] = { ratePerEur: r.ratePerEur, asOf: r.asOf };
	return rates;
}
