/**
 * Regions as editors keep them, reading: currency, tax display mode, category factors, and
 * tax rates with the date each takes effect (VAT rates move; docs/sources.md note 9).
 * Changes are regions.ts's.
 *
 * Where the rate lives: region_tax_rates holds the dated history; the rate in force on a
 * day is the row with the latest effective_from on or before it. regions.tax_rate_bp
 * stays as a cache of the rate in force today, rewritten in the same transaction as every
 * change to the history and by syncCurrentTaxRates() (for rates dated in the future once
 * their day comes), so code that only needs today's rate can keep reading the column.
 * Days are UTC calendar days.
 *
 * A region with no dated rows yet has only its column rate. Before its first dated rate
 * is recorded, that rate is written into the history from the day the region was set up,
 * so adding a future rate never rewrites what applied before it.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { PART_CATEGORIES, type PartCategory } from '$lib/domain/types';
import { Region, RegionTaxRate, User } from '$lib/server/db';
import type { EditorRegion, EditorRegionDetail, PublicRegion } from '$lib/views';

/** Today's UTC calendar day, 'YYYY-MM-DD'. */
export function utcDay(now = new Date()): string {
	return now.toISOString().slice(0, 10);
}

/** A factor for every category (10000 = ×1.00 where none is set). */
export function fullFactors(
	factors: Partial<Record<PartCategory, number>> | null | undefined
): Record<PartCategory, number> {
	return Object.fromEntries(PART_CATEGORIES.map((c) => [c, factors?.[c] ?? 10_000])) as Record<
		PartCategory,
		number
	>;
}

/** The history of one region, oldest first. */
async function history(regionId: number, transaction?: Transaction) {
	return RegionTaxRate.findAll({
		where: { regionId },
		include: [{ model: User, as: 'createdBy', attributes: ['name', 'email'] }],
		order: [['effectiveFrom', 'ASC']],
		transaction
	});
}

/** The row in force on `day` from an oldest-first history, or undefined before the first. */
export function inForce<T extends { effectiveFrom: string }>(
	rows: T[],
	day: string
): T | undefined {
	let found: T | undefined;
	for (const row of rows) if (row.effectiveFrom <= day) found = row;
	return found;
}

function summarise(region: Region, rows: RegionTaxRate[], today: string): EditorRegion {
	const current = inForce(rows, today);
	const next = rows.find((r) => r.effectiveFrom > today);
	return {
		code: region.code,
		name: region.name,
		currency: region.currency,
		taxMode: region.taxMode,
		taxRateBp: current ? current.rateBp : rows.length ? 0 : region.taxRateBp,
		taxRateSince: current?.effectiveFrom ?? null,
		nextTaxRate: next ? { rateBp: next.rateBp, effectiveFrom: next.effectiveFrom } : null,
		categoryFactorsBp: fullFactors(region.categoryFactorsBp)
	};
}

/** Every region with its rate in force today, by name. */
export async function listRegions(now = new Date()): Promise<EditorRegion[]> {
	const regions = await Region.findAll({ order: [['name', 'ASC']] });
	const rates = await RegionTaxRate.findAll({ order: [['effectiveFrom', 'ASC']] });
	const today = utcDay(now);
	return regions.map((r) =>
		summarise(
			r,
			rates.filter((t) => t.regionId === r.id),
			today
		)
	);
}

/** One region with its full rate history, or null. */
export async function getRegion(
	code: string,
	now = new Date()
): Promise<EditorRegionDetail | null> {
	const region = await Region.findOne({ where: { code } });
	if (!region) return null;
	const rows = await history(region.id);
	const today = utcDay(now);
	const current = inForce(rows, today);
	return {
		...summarise(region, rows, today),
		taxRates: rows
			.map((r) => {
				const by = (r as RegionTaxRate & { createdBy?: User | null }).createdBy;
				return {
					id: r.id,
					rateBp: r.rateBp,
					effectiveFrom: r.effectiveFrom,
					note: r.note,
					recordedBy: by ? by.name?.trim() || by.email : null,
					current: r === current,
					upcoming: r.effectiveFrom > today
				};
			})
			.reverse()
	};
}

/**
 * The rate of region `code` in force on `day` ('YYYY-MM-DD'): from the dated history, or
 * the region's column rate when it has no history. Null for an unknown region, or a day
 * before the first dated rate.
 */
export async function taxRateOn(code: string, day: string): Promise<number | null> {
	const region = await Region.findOne({ where: { code }, attributes: ['id', 'taxRateBp'] });
	if (!region) return null;
	const row = await RegionTaxRate.findOne({
		where: { regionId: region.id, effectiveFrom: { [Op.lte]: day } },
		order: [['effectiveFrom', 'DESC']]
	});
	if (row) return row.rateBp;
	const any = await RegionTaxRate.count({ where: { regionId: region.id } });
	return any === 0 ? region.taxRateBp : null;
}

export async function publicRegions(now = new Date()): Promise<PublicRegion[]> {
	return (await listRegions(now)).map((r) => ({
		code: r.code,
		name: r.name,
		currency: r.currency,
		taxMode: r.taxMode,
		taxRateBp: r.taxRateBp,
		taxRateSince: r.taxRateSince,
		nextTaxRate: r.nextTaxRate,
		categoryFactorsBp: r.categoryFactorsBp
	}));
}
