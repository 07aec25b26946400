/**
 * Price sightings, reading: the report form's choices, a reader's own sightings of a part,
 * and the editors' queue of pending ones. Submitting, verifying and rejecting are
 * price-sightings.ts's.
 */
import { Op } from 'sequelize';
import type { WhereOptions } from 'sequelize';
import { minorUnitDigits } from '$lib/domain/money';
import { SIGHTINGS_PER_PAGE } from '$lib/schemas/price-sightings';
import type { PendingSightingsQuery } from '$lib/schemas/price-sightings';
import { Part, PriceSighting, PriceSightingReport, Region, Store, User } from '$lib/server/db';
import type { MySighting, PendingSighting, SightingRegionOption } from '$lib/views';
import type { Paged } from './audit';
import { partName } from './mappers';
import { escapeLike, pageWindow } from './list-query';

const MY_SIGHTINGS_LIMIT = 20;

/** Regions with their stores, for the report form's choices. */
export async function formOptions(): Promise<SightingRegionOption[]> {
	const regions = await Region.findAll({
		order: [['name', 'ASC']],
		attributes: ['id', 'code', 'name', 'currency']
	});
	const stores = await Store.findAll({
		order: [['name', 'ASC']],
		attributes: ['id', 'name', 'regionId']
	});
	return regions.map((r) => ({
		code: r.code,
		name: r.name,
		currency: r.currency,
		digits: minorUnitDigits(r.currency),
		stores: stores.filter((s) => s.regionId === r.id).map((s) => ({ id: s.id, name: s.name }))
	}));
}

type LoadedSighting = PriceSighting & { store: Store; region: Region };

/** The user's sightings of one part (any they reported, merged ones too), newest first. */
export async function listMine(userId: string, partSlug: string): Promise<MySighting[]> {
	const part = await Part.findOne({ where: { slug: partSlug }, attributes: ['id'] });
	if (!part) return [];
	const rows = (await PriceSighting.findAll({
		where: { partId: part.id },
		include: [
			{ model: PriceSightingReport, as: 'reports', where: { userId }, attributes: [] },
			{ model: Store, as: 'store', attributes: ['name'] },
			{ model: Region, as: 'region', attributes: ['name'] }
		],
		order: [
			['observedOn', 'DESC'],
			['id', 'DESC']
		],
		limit: MY_SIGHTINGS_LIMIT,
		subQuery: false
	})) as LoadedSighting[];
	return rows.map((s) => ({
		id: s.id,
		storeName: s.store.name,
		regionName: s.region.name,
		price: { amountMinor: Number(s.amountMinor), currency: s.currency },
		observedOn: s.observedOn,
		seenCount: s.seenCount,
		state: s.state,
		rejectReason: s.rejectReason
	}));
}

/** Pending sightings, oldest report first, optionally of one region and matching part words. */
export async function listPending(
	query: PendingSightingsQuery,
	perPage = SIGHTINGS_PER_PAGE
): Promise<Paged<PendingSighting> & { regions: { code: string; name: string }[] }> {
	const regions = await Region.findAll({
		order: [['name', 'ASC']],
		attributes: ['id', 'code', 'name']
	});
	const conditions: WhereOptions[] = [{ state: 'pending' }];
	if (query.region) {
		const region = regions.find((r) => r.code === query.region);
		// An unknown region matches nothing rather than everything.
		conditions.push({ regionId: region ? region.id : 0 });
	}
	for (const word of query.q.split(/\s+/).filter(Boolean).slice(0, 8)) {
		const pattern = `%${escapeLike(word)}%`;
		conditions.push({
			[Op.or]: [
				{ '$part.brand$': { [Op.like]: pattern } },
				{ '$part.model$': { [Op.like]: pattern } }
			]
		});
	}
	const where = { [Op.and]: conditions };
	const include = [
		{ model: Part, as: 'part', attributes: ['slug', 'brand', 'model'] },
		{ model: Store, as: 'store', attributes: ['name'] },
		{ model: Region, as: 'region', attributes: ['code', 'name'] },
		{ model: User, as: 'submittedBy', attributes: ['name', 'email'] }
	];
	const total = await PriceSighting.count({
		where,
		include: [{ model: Part, as: 'part', attributes: [] }]
	});
	const window = pageWindow(total, query.page, perPage);
	const rows = (await PriceSighting.findAll({
		where,
		include,
		order: [
			['createdAt', 'ASC'],
			['id', 'ASC']
		],
		limit: perPage,
		offset: window.offset,
		subQuery: false
	})) as (LoadedSighting & { part: Part; submittedBy: User | null })[];
	return {
		items: rows.map((s) => ({
			id: s.id,
			part: { slug: s.part.slug, name: partName(s.part) },
			storeName: s.store.name,
			region: { code: s.region.code, name: s.region.name },
			price: { amountMinor: Number(s.amountMinor), currency: s.currency },
			observedOn: s.observedOn,
			url: s.url,
			seenCount: s.seenCount,
			submittedBy: s.submittedBy ? { name: s.submittedBy.name, email: s.submittedBy.email } : null,
			createdAt: s.createdAt.toISOString()
		})),
		total,
		page: window.page,
		perPage,
		pageCount: window.pageCount,
		regions: regions.map((r) => ({ code: r.code, name: r.name }))
	};
}
