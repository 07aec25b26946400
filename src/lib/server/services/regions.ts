/**
 * Regions as editors keep them, changing: settings (name, currency, tax display mode,
 * category factors) and the dated tax-rate history, every change audited in its transaction.
 * regions.tax_rate_bp caches the rate in force today (see region-reads.ts); it is rewritten
 * in the same transaction as every change to the history, and by syncCurrentTaxRates() for
 * rates dated in the future once their day comes. Days are UTC calendar days.
 *
 * A region with no dated rows yet has only its column rate. Before its first dated rate
 * is recorded, that rate is written into the history from the day the region was set up,
 * so adding a future rate never rewrites what applied before it.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { minorUnitDigits } from '$lib/domain/money';
import { fieldIssues } from '$lib/schemas/issues';
import { regionSettingsInput, taxRateInput } from '$lib/schemas/regions';
import { Region, RegionTaxRate, sequelize } from '$lib/server/db';
import * as audit from './audit';
import type { Issues, Outcome } from '$lib/schemas/issues';
import { fullFactors, inForce, utcDay } from './region-reads';
import { bumpGuideViews } from './cache-generations';
import * as guidePrices from './guide-prices';

function knownCurrency(code: string): boolean {
	try {
		minorUnitDigits(code);
		return true;
	} catch {
		return false;
	}
}

function settingsSnapshot(region: Region) {
	return {
		name: region.name,
		currency: region.currency,
		taxMode: region.taxMode,
		categoryFactorsBp: fullFactors(region.categoryFactorsBp)
	};
}

/** Changes name, currency, tax display mode and category factors of region `code`. */
export async function updateSettings(
	actorId: string,
	code: string,
	raw: unknown
): Promise<Outcome<{ changed: boolean }>> {
	const input = regionSettingsInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const data = input.data;
	if (!knownCurrency(data.currency)) {
		return {
			kind: 'invalid',
			issues: { currency: [`Unknown currency code "${data.currency}" (ISO 4217).`] }
		};
	}
	const outcome = await sequelize.transaction(async (transaction) => {
		const region = await Region.findOne({
			where: { code },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!region) return { kind: 'not_found' } as const;
		const before = settingsSnapshot(region);
		const after = {
			name: data.name,
			currency: data.currency,
			taxMode: data.taxMode,
			categoryFactorsBp: data.categoryFactorsBp
		};
		if (JSON.stringify(before) === JSON.stringify(after))
			return { kind: 'ok', changed: false } as const;
		await region.update(after, { transaction });
		await audit.record(
			{
				actorId,
				action: 'region.updated',
				subjectType: 'region',
				subjectId: region.code,
				before,
				after
			},
			transaction
		);
		return { kind: 'ok', changed: true } as const;
	});
	if (outcome.kind === 'ok') await figuresFollow();
	return outcome;
}

/** Rewrites regions.tax_rate_bp from the history for `day`; returns the new value. */
async function refreshColumn(
	region: Region,
	day: string,
	transaction: Transaction
): Promise<number> {
	const row = await RegionTaxRate.findOne({
		where: { regionId: region.id, effectiveFrom: { [Op.lte]: day } },
		order: [['effectiveFrom', 'DESC']],
		transaction
	});
	const rate = row ? row.rateBp : 0;
	if (region.taxRateBp !== rate) await region.update({ taxRateBp: rate }, { transaction });
	return rate;
}

/**
 * Records that region `code` charges `rate` from `effectiveFrom` on. One rate per day:
 * a second one for the same day is refused (remove the wrong one first).
 */
export async function addTaxRate(
	actorId: string,
	code: string,
	raw: unknown,
	now = new Date()
): Promise<Outcome<{ rateId: number }>> {
	const input = taxRateInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const { rate, effectiveFrom, note } = input.data;
	const today = utcDay(now);
	const outcome = await sequelize.transaction(async (transaction) => {
		const region = await Region.findOne({
			where: { code },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!region) return { kind: 'not_found' } as const;
		const rows = await RegionTaxRate.findAll({ where: { regionId: region.id }, transaction });
		if (rows.some((r) => r.effectiveFrom === effectiveFrom)) {
			const issues: Issues = {
				effectiveFrom: [`A rate already starts on ${effectiveFrom}; remove it first to replace it.`]
			};
			return { kind: 'invalid', issues } as const;
		}
		if (rows.length === 0) {
			// Keep what applied so far: the column rate, from the day the region was set up.
			const since = utcDay(region.createdAt);
			if (since !== effectiveFrom) {
				await RegionTaxRate.create(
					{
						regionId: region.id,
						rateBp: region.taxRateBp,
						effectiveFrom: since,
						note: 'Rate recorded when the region was set up',
						createdById: actorId
					},
					{ transaction }
				);
			}
		}
		const row = await RegionTaxRate.create(
			{ regionId: region.id, rateBp: rate, effectiveFrom, note, createdById: actorId },
			{ transaction }
		);
		const before = { taxRateBp: region.taxRateBp };
		const current = await refreshColumn(region, today, transaction);
		await audit.record(
			{
				actorId,
				action: 'region.tax_rate_added',
				subjectType: 'region',
				subjectId: region.code,
				before,
				after: { rateBp: rate, effectiveFrom, note, taxRateBp: current }
			},
			transaction
		);
		return { kind: 'ok', rateId: row.id } as const;
	});
	if (outcome.kind === 'ok') await figuresFollow();
	return outcome;
}

/** Removes one dated rate of region `code` (a mistake); the last remaining one cannot go. */
export async function removeTaxRate(
	actorId: string,
	code: string,
	rateId: number,
	now = new Date()
): Promise<Outcome> {
	const outcome = await sequelize.transaction(async (transaction) => {
		const region = await Region.findOne({
			where: { code },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!region) return { kind: 'not_found' } as const;
		const row = await RegionTaxRate.findOne({
			where: { id: rateId, regionId: region.id },
			transaction
		});
		if (!row) return { kind: 'not_found' } as const;
		const rows = await RegionTaxRate.findAll({
			where: { regionId: region.id },
			order: [['effectiveFrom', 'ASC']],
			transaction
		});
		if (rows.length === 1)
			return {
				kind: 'conflict',
				message: 'This is the only rate on record; add the right one before removing it.'
			} as const;
		const today = utcDay(now);
		const remaining = rows.filter((r) => r.id !== row.id);
		if (inForce(rows, today) && !inForce(remaining, today)) {
			return {
				kind: 'conflict',
				message: 'Removing it would leave no rate in force today; add the right one first.'
			} as const;
		}
		const before = {
			rateBp: row.rateBp,
			effectiveFrom: row.effectiveFrom,
			note: row.note,
			taxRateBp: region.taxRateBp
		};
		await row.destroy({ transaction });
		const current = await refreshColumn(region, today, transaction);
		await audit.record(
			{
				actorId,
				action: 'region.tax_rate_removed',
				subjectType: 'region',
				subjectId: region.code,
				before,
				after: { taxRateBp: current }
			},
			transaction
		);
		return { kind: 'ok' } as const;
	});
	if (outcome.kind === 'ok') await figuresFollow();
	return outcome;
}

/**
 * Brings every regions.tax_rate_bp in line with the history for `now` (a rate dated in
 * the future takes over on its day). Idempotent; meant for a daily job. Returns the codes
 * of the regions whose cached rate changed.
 */
export async function syncCurrentTaxRates(now = new Date()): Promise<string[]> {
	const day = utcDay(now);
	const outcome = await sequelize.transaction(async (transaction) => {
		const changed: string[] = [];
		const regions = await Region.findAll({ transaction, lock: transaction.LOCK.UPDATE });
		for (const region of regions) {
			const rows = await RegionTaxRate.count({ where: { regionId: region.id }, transaction });
			if (rows === 0) continue;
			const before = region.taxRateBp;
			const after = await refreshColumn(region, day, transaction);
			if (before !== after) {
				changed.push(region.code);
				await audit.record(
					{
						actorId: null,
						action: 'region.tax_rate_in_force',
						subjectType: 'region',
						subjectId: region.code,
						before: { taxRateBp: before },
						after: { taxRateBp: after, day }
					},
					transaction
				);
			}
		}
		return changed;
	});
	if (outcome.length > 0) await figuresFollow();
	return outcome;
}

/**
 * Tax and category factors change every figure in the region. Guide pages and the pricing
 * API price live: their cached views are dropped at once, in every app process. The stored
 * list figures of every published guide are re-stored after the answer (the pass grows with
 * the number of guides; changes in quick succession share one pass).
 */
async function figuresFollow(): Promise<void> {
	await bumpGuideViews();
	guidePrices.refreshAllLater();
}
