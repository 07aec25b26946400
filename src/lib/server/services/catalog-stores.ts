/**
 * Stores and the quotes seen at them, changing: the editor adds, renames and removes stores
 * and records prices. Every write is validated with zod first, runs in one transaction and
 * records an audit event in that transaction, so a refused or failed change leaves no row
 * behind. Field messages are keyed by form field name.
 */
import { Op, UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import { decimalMarkOf, minorUnitDigits, parseAmount } from '$lib/domain/money';
import { quoteInput, storeInput, withdrawQuoteInput } from '$lib/schemas/catalog-upkeep';
import { fieldIssues } from '$lib/schemas/issues';
import { Part, Quote, Region, Store, sequelize } from '$lib/server/db';
import * as audit from './audit';
import type { Issues, Outcome } from '$lib/schemas/issues';
import * as guidePrices from './guide-prices';

function add(issues: Issues, key: string, message: string) {
	(issues[key] ??= []).push(message);
}

function storeSnapshot(store: { name: string; url: string }, regionCode: string) {
	return { name: store.name, url: store.url, regionCode };
}

async function regionByCode(code: string, transaction: Transaction) {
	return Region.findOne({ where: { code }, transaction });
}

function nameTaken(name: string): Issues {
	return { name: [`A store called "${name}" already exists.`] };
}

/** Adds a store (name unique across regions, since quotes and guides name stores). */
export async function createStore(
	actorId: string,
	raw: unknown
): Promise<Outcome<{ storeId: number }>> {
	const input = storeInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const { name, url, regionCode } = input.data;
	try {
		return await sequelize.transaction(async (transaction) => {
			const region = await regionByCode(regionCode, transaction);
			if (!region)
				return {
					kind: 'invalid',
					issues: { regionCode: [`Unknown region "${regionCode}".`] }
				} as const;
			if (await Store.findOne({ where: { name }, attributes: ['id'], transaction })) {
				return { kind: 'invalid', issues: nameTaken(name) } as const;
			}
			const store = await Store.create({ name, url, regionId: region.id }, { transaction });
			await audit.record(
				{
					actorId,
					action: 'store.created',
					subjectType: 'store',
					subjectId: store.id,
					after: storeSnapshot(store, region.code)
				},
				transaction
			);
			return { kind: 'ok', storeId: store.id } as const;
		});
	} catch (e) {
		if (e instanceof UniqueConstraintError) return { kind: 'invalid', issues: nameTaken(name) };
		throw e;
	}
}

/** Changes a store's name, region or address. */
export async function updateStore(
	actorId: string,
	storeId: number,
	raw: unknown
): Promise<Outcome<{ storeId: number }>> {
	const input = storeInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const { name, url, regionCode } = input.data;
	try {
		return await sequelize.transaction(async (transaction) => {
			const store = await Store.findByPk(storeId, { transaction, lock: transaction.LOCK.UPDATE });
			if (!store) return { kind: 'not_found' } as const;
			const region = await regionByCode(regionCode, transaction);
			if (!region)
				return {
					kind: 'invalid',
					issues: { regionCode: [`Unknown region "${regionCode}".`] }
				} as const;
			const clash = await Store.findOne({
				where: { name, id: { [Op.ne]: store.id } },
				attributes: ['id'],
				transaction
			});
			if (clash) return { kind: 'invalid', issues: nameTaken(name) } as const;
			const oldRegion = await Region.findByPk(store.regionId, {
				attributes: ['code'],
				transaction
			});
			const before = storeSnapshot(store, oldRegion?.code ?? '');
			await store.update({ name, url, regionId: region.id }, { transaction });
			await audit.record(
				{
					actorId,
					action: 'store.updated',
					subjectType: 'store',
					subjectId: store.id,
					before,
					after: storeSnapshot(store, region.code)
				},
				transaction
			);
			return { kind: 'ok', storeId: store.id } as const;
		});
	} catch (e) {
		if (e instanceof UniqueConstraintError) return { kind: 'invalid', issues: nameTaken(name) };
		throw e;
	}
}

/** Removes a store that has no quotes; one with quotes is refused, since its price history would go with it. */
export async function deleteStore(actorId: string, storeId: number): Promise<Outcome> {
	return sequelize.transaction(async (transaction) => {
		const store = await Store.findByPk(storeId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!store) return { kind: 'not_found' } as const;
		const quotes = await Quote.count({ where: { storeId }, transaction });
		if (quotes > 0) {
			return {
				kind: 'conflict',
				message: `${store.name} has ${quotes === 1 ? '1 quote' : `${quotes} quotes`}: a store with a price history cannot be removed.`
			} as const;
		}
		const region = await Region.findByPk(store.regionId, { attributes: ['code'], transaction });
		await store.destroy({ transaction });
		await audit.record(
			{
				actorId,
				action: 'store.deleted',
				subjectType: 'store',
				subjectId: storeId,
				before: storeSnapshot(store, region?.code ?? '')
			},
			transaction
		);
		return { kind: 'ok' } as const;
	});
}

function knownDigits(currency: string): number | null {
	try {
		return minorUnitDigits(currency);
	} catch {
		return null;
	}
}

/**
 * Records a price seen at a store. The amount is typed as a decimal and stored in minor
 * units of the currency (its ISO 4217 exponent); more decimals than the currency has are
 * refused, never rounded. Region and currency default to the store's region and its
 * currency; a region other than the store's is refused.
 */
export async function addQuote(
	actorId: string,
	raw: unknown,
	now = new Date()
): Promise<Outcome<{ quoteId: number }>> {
	const input = quoteInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const data = input.data;
	const outcome = await sequelize.transaction(async (transaction) => {
		const issues: Issues = {};
		const part = await Part.findOne({
			where: { slug: data.partSlug },
			attributes: ['id', 'slug'],
			transaction
		});
		if (!part) add(issues, 'partSlug', `No part has the slug "${data.partSlug}".`);
		const store = await Store.findByPk(data.storeId, { transaction });
		if (!store) add(issues, 'storeId', 'Choose a store from the list.');
		const storeRegion = store ? await Region.findByPk(store.regionId, { transaction }) : null;
		let region = storeRegion;
		if (data.regionCode !== undefined) {
			region = await regionByCode(data.regionCode, transaction);
			if (!region) add(issues, 'regionCode', `Unknown region "${data.regionCode}".`);
			else if (storeRegion && region.id !== storeRegion.id) {
				add(
					issues,
					'regionCode',
					`${store?.name} sells in ${storeRegion.name} (${storeRegion.code}); leave the region empty or choose that one.`
				);
			}
		}
		const currency = data.currency ?? region?.currency;
		const digits = currency ? knownDigits(currency) : null;
		if (data.currency !== undefined && digits === null)
			add(issues, 'currency', `Unknown currency code "${data.currency}".`);
		let amountMinor = 0;
		let shippingMinor = 0;
		if (currency && digits !== null) {
			// Read as the quote's region writes amounts ("129,90" where it writes the decimal comma).
			const mark = region ? decimalMarkOf(region.code) : '.';
			const amount = parseAmount(data.amount, currency, mark);
			if (!amount.ok) add(issues, 'amount', amount.message);
			else if (amount.amountMinor === 0) add(issues, 'amount', 'The price must be more than zero.');
			else amountMinor = amount.amountMinor;
			if (data.shipping !== undefined) {
				const shipping = parseAmount(data.shipping, currency, mark);
				if (!shipping.ok) add(issues, 'shipping', shipping.message);
				else shippingMinor = shipping.amountMinor;
			}
		}
		if (Object.keys(issues).length > 0 || !part || !store || !region || !currency) {
			return { kind: 'invalid', issues } as const;
		}
		const today = now.toISOString().slice(0, 10);
		// A past day is stored at midday UTC, so it reads as that day in every time zone near UTC.
		const observedAt = data.observedOn === today ? now : new Date(`${data.observedOn}T12:00:00Z`);
		const quote = await Quote.create(
			{
				partId: part.id,
				storeId: store.id,
				regionId: region.id,
				amountMinor,
				currency,
				taxIncluded: data.taxIncluded,
				shippingMinor,
				observedAt,
				url: data.url ?? null,
				source: 'editor'
			},
			{ transaction }
		);
		await audit.record(
			{
				actorId,
				action: 'quote.created',
				subjectType: 'quote',
				subjectId: quote.id,
				after: {
					partSlug: part.slug,
					store: store.name,
					regionCode: region.code,
					amountMinor,
					shippingMinor,
					currency,
					taxIncluded: data.taxIncluded,
					observedAt: observedAt.toISOString()
				}
			},
			transaction
		);
		return { kind: 'ok', quoteId: quote.id } as const;
	});
	// The new quote may now be the latest for its part: re-store the figures that use it.
	if (outcome.kind === 'ok') await guidePrices.refreshForQuotes([outcome.quoteId]);
	return outcome;
}

/**
 * Withdraws a quote: the store no longer sells the part (at that price). The row stays for
 * the price history, but no total, pick or upkeep check counts it any more, so a pick left
 * with no active quote in a region raises the "gone from the stores" alert. Withdrawing a
 * withdrawn quote again changes nothing.
 */
export async function withdrawQuote(actorId: string, raw: unknown): Promise<Outcome> {
	const input = withdrawQuoteInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const outcome = await sequelize.transaction(async (transaction) => {
		const quote = await Quote.findByPk(input.data.quoteId, { transaction, lock: true });
		if (!quote) return { kind: 'not_found' } as const;
		if (quote.status === 'withdrawn') return { kind: 'ok', changed: false } as const;
		const before = quote.status;
		await quote.update({ status: 'withdrawn' }, { transaction });
		await audit.record(
			{
				actorId,
				action: 'quote.withdrawn',
				subjectType: 'quote',
				subjectId: quote.id,
				before: { status: before },
				after: { status: 'withdrawn' }
			},
			transaction
		);
		return { kind: 'ok', changed: true } as const;
	});
	if (outcome.kind !== 'ok') return outcome;
	if (outcome.changed) await guidePrices.refreshForQuotes([input.data.quoteId]);
	return { kind: 'ok' };
}
