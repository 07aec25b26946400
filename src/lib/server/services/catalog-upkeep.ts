/**
 * The editor's upkeep of the catalog: parts (specs checked by the category's schema),
 * stores, and quotes. Every write is validated with zod first, runs in one transaction
 * and records an audit event in that transaction, so a refused or failed change leaves
 * no row behind. Routes get plain objects and field messages keyed by form field name.
 */
import { Op, UniqueConstraintError } from 'sequelize';
import type { Transaction, WhereOptions } from 'sequelize';
import { minorUnitDigits } from '$lib/domain/money';
import type { PartCategory, QuoteSource, TaxMode } from '$lib/domain/types';
import {
	EDITOR_PAGE_SIZE,
	RESERVED_PART_SLUGS,
	partFieldsInput,
	quoteInput,
	slugify,
	storeInput,
	validateSpecs,
	decimalToMinor
} from '$lib/schemas/catalog-upkeep';
import { fieldIssues } from '$lib/schemas/issues';
import { Part, Quote, Region, Store, sequelize } from '$lib/server/db';
import * as audit from './audit';
import type { Paged } from './audit';
import { escapeLike } from './users';
import type { Issues, Outcome } from './outcome';

export type { Issues, Outcome } from './outcome';

export interface PartRow {
	id: number;
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	updatedAt: string;
}

export interface PartDetail extends PartRow {
	specs: Record<string, unknown>;
}

/** A part as checked before writing: what the row will hold. */
export interface CheckedPart {
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}

function add(issues: Issues, key: string, message: string) {
	(issues[key] ??= []).push(message);
}

/**
 * Checks a whole part (category, brand, model, optional slug, specs) without touching the
 * database. Spec problems are keyed `spec.<path>`; problems of the specs object as a
 * whole (an unknown field) under `spec`. The CSV import uses the same check per row.
 */
export function checkPart(raw: {
	category?: unknown;
	brand?: unknown;
	model?: unknown;
	slug?: unknown;
	specs?: unknown;
}): { ok: true; part: CheckedPart } | { ok: false; issues: Issues } {
	const fields = partFieldsInput.safeParse({
		category: raw.category,
		brand: raw.brand,
		model: raw.model,
		slug: raw.slug
	});
	const issues: Issues = fields.success ? {} : fieldIssues(fields.error);
	const category = fields.success ? fields.data.category : partCategoryOf(raw.category);
	let specs: Record<string, unknown> | null = null;
	if (category) {
		const checked = validateSpecs(category, raw.specs);
		if (checked.ok) specs = checked.specs;
		else
			for (const issue of checked.issues)
				add(issues, issue.path ? `spec.${issue.path}` : 'spec', issue.message);
	}
	if (!fields.success || !specs || !category) return { ok: false, issues };
	const slug = fields.data.slug ?? slugify(fields.data.brand, fields.data.model);
	if (slug === '' || (RESERVED_PART_SLUGS as readonly string[]).includes(slug)) {
		return {
			ok: false,
			issues: { slug: ['Enter a slug: none can be made from this brand and model.'] }
		};
	}
	return {
		ok: true,
		part: { category, brand: fields.data.brand, model: fields.data.model, slug, specs }
	};
}

function partCategoryOf(value: unknown): PartCategory | null {
	const parsed = partFieldsInput.shape.category.safeParse(value);
	return parsed.success ? parsed.data : null;
}

function toPartRow(part: Part): PartRow {
	return {
		id: part.id,
		category: part.category,
		brand: part.brand,
		model: part.model,
		slug: part.slug,
		updatedAt: part.updatedAt.toISOString()
	};
}

function snapshot(part: {
	category: string;
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}) {
	return {
		category: part.category,
		brand: part.brand,
		model: part.model,
		slug: part.slug,
		specs: part.specs
	};
}

/** Parts whose brand, model or slug contains `q` (wildcards taken literally), optionally one category, A–Z. */
export async function listParts(options: {
	q: string;
	category?: PartCategory;
	page: number;
}): Promise<Paged<PartRow>> {
	const conditions: WhereOptions<Part>[] = [];
	const q = options.q.trim();
	if (q !== '') {
		const pattern = `%${escapeLike(q)}%`;
		conditions.push({
			[Op.or]: [
				{ brand: { [Op.like]: pattern } },
				{ model: { [Op.like]: pattern } },
				{ slug: { [Op.like]: pattern } }
			]
		});
	}
	if (options.category) conditions.push({ category: options.category });
	const where: WhereOptions<Part> = conditions.length ? { [Op.and]: conditions } : {};
	const total = await Part.count({ where });
	const window = audit.pageWindow(total, options.page, EDITOR_PAGE_SIZE);
	const parts = await Part.findAll({
		where,
		attributes: ['id', 'category', 'brand', 'model', 'slug', 'updatedAt'],
		order: [
			['brand', 'ASC'],
			['model', 'ASC'],
			['id', 'ASC']
		],
		limit: EDITOR_PAGE_SIZE,
		offset: window.offset
	});
	return {
		items: parts.map(toPartRow),
		total,
		page: window.page,
		perPage: EDITOR_PAGE_SIZE,
		pageCount: window.pageCount
	};
}

export async function getPart(slug: string): Promise<PartDetail | null> {
	const part = await Part.findOne({ where: { slug } });
	return part ? { ...toPartRow(part), specs: part.specs } : null;
}

function slugTaken(slug: string): Issues {
	return { slug: [`A part with the slug "${slug}" already exists; choose another.`] };
}

/** Adds a part to the catalog on behalf of editor `actorId`. */
export async function createPart(
	actorId: string,
	raw: Parameters<typeof checkPart>[0]
): Promise<Outcome<{ part: PartDetail }>> {
	const checked = checkPart(raw);
	if (!checked.ok) return { kind: 'invalid', issues: checked.issues };
	const data = checked.part;
	try {
		return await sequelize.transaction(async (transaction) => {
			if (await Part.findOne({ where: { slug: data.slug }, attributes: ['id'], transaction })) {
				return { kind: 'invalid', issues: slugTaken(data.slug) } as const;
			}
			const part = await Part.create({ ...data }, { transaction });
			await audit.record(
				{
					actorId,
					action: 'part.created',
					subjectType: 'part',
					subjectId: part.id,
					after: snapshot(data)
				},
				transaction
			);
			return { kind: 'ok', part: { ...toPartRow(part), specs: part.specs } } as const;
		});
	} catch (e) {
		// Two editors adding the same slug at once: the unique index decides.
		if (e instanceof UniqueConstraintError)
			return { kind: 'invalid', issues: slugTaken(data.slug) };
		throw e;
	}
}

/**
 * Changes brand, model and specs of the part `slug`. Category and slug stay: guides and
 * links refer to the part, and its specs only make sense for its category.
 */
export async function updatePart(
	actorId: string,
	slug: string,
	raw: { brand?: unknown; model?: unknown; specs?: unknown }
): Promise<Outcome<{ part: PartDetail; changed: boolean }>> {
	return sequelize.transaction(async (transaction) => {
		const part = await Part.findOne({
			where: { slug },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!part) return { kind: 'not_found' } as const;
		const checked = checkPart({
			category: part.category,
			brand: raw.brand,
			model: raw.model,
			slug: part.slug,
			specs: raw.specs
		});
		if (!checked.ok) return { kind: 'invalid', issues: checked.issues } as const;
		const before = snapshot(part);
		const after = snapshot({ ...checked.part, category: part.category, slug: part.slug });
		if (stableJson(before) === stableJson(after)) {
			return {
				kind: 'ok',
				part: { ...toPartRow(part), specs: part.specs },
				changed: false
			} as const;
		}
		await part.update(
			{ brand: after.brand, model: after.model, specs: after.specs },
			{ transaction }
		);
		await audit.record(
			{ actorId, action: 'part.updated', subjectType: 'part', subjectId: part.id, before, after },
			transaction
		);
		return { kind: 'ok', part: { ...toPartRow(part), specs: part.specs }, changed: true } as const;
	});
}

/** JSON with object keys sorted, so two equal specs compare equal whatever their key order. */
export function stableJson(value: unknown): string {
	return JSON.stringify(value, (_key, v: unknown) =>
		v && typeof v === 'object' && !Array.isArray(v)
			? Object.fromEntries(
					Object.entries(v as Record<string, unknown>).sort(([a], [b]) =>
						a < b ? -1 : a > b ? 1 : 0
					)
				)
			: v
	);
}

// ---------------------------------------------------------------- stores

export interface StoreRow {
	id: number;
	name: string;
	url: string;
	region: { code: string; name: string; currency: string };
	quoteCount: number;
}

export interface RegionOption {
	code: string;
	name: string;
	currency: string;
	taxMode: TaxMode;
}

/** Regions for the store and quote forms, by name. */
export async function regionOptions(): Promise<RegionOption[]> {
	const regions = await Region.findAll({
		attributes: ['code', 'name', 'currency', 'taxMode'],
		order: [['name', 'ASC']]
	});
	return regions.map((r) => ({
		code: r.code,
		name: r.name,
		currency: r.currency,
		taxMode: r.taxMode
	}));
}

/** Every store with its region and how many quotes it has, by name. */
export async function listStores(): Promise<StoreRow[]> {
	const stores = await Store.findAll({
		include: [{ model: Region, as: 'region', attributes: ['code', 'name', 'currency'] }],
		order: [['name', 'ASC']]
	});
	const counts = await Quote.count({ group: ['storeId'] });
	const byStore = new Map(
		counts.map((c) => [Number((c as unknown as { storeId: number }).storeId), Number(c.count)])
	);
	return stores.map((s) => {
		const region = (s as Store & { region?: Region }).region;
		return {
			id: s.id,
			name: s.name,
			url: s.url,
			region: {
				code: region?.code ?? '',
				name: region?.name ?? '',
				currency: region?.currency ?? ''
			},
			quoteCount: byStore.get(s.id) ?? 0
		};
	});
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

// ---------------------------------------------------------------- quotes

export interface QuoteRow {
	id: number;
	part: { slug: string; brand: string; model: string };
	store: string;
	regionCode: string;
	amountMinor: number;
	shippingMinor: number;
	currency: string;
	taxIncluded: boolean;
	observedAt: string;
	source: QuoteSource;
}

/** The latest quotes, newest observation first; only one part's when `partSlug` is given. */
export async function listRecentQuotes(
	options: { limit?: number; partSlug?: string } = {}
): Promise<QuoteRow[]> {
	const quotes = await Quote.findAll({
		include: [
			{
				model: Part,
				as: 'part',
				attributes: ['slug', 'brand', 'model'],
				...(options.partSlug ? { where: { slug: options.partSlug } } : {})
			},
			{ model: Store, as: 'store', attributes: ['name'] },
			{ model: Region, as: 'region', attributes: ['code'] }
		],
		order: [
			['observedAt', 'DESC'],
			['id', 'DESC']
		],
		limit: Math.min(Math.max(1, options.limit ?? 25), 100)
	});
	return quotes.map((q) => {
		const joined = q as Quote & { part?: Part; store?: Store; region?: Region };
		return {
			id: q.id,
			part: {
				slug: joined.part?.slug ?? '',
				brand: joined.part?.brand ?? '',
				model: joined.part?.model ?? ''
			},
			store: joined.store?.name ?? '',
			regionCode: joined.region?.code ?? '',
			amountMinor: Number(q.amountMinor),
			shippingMinor: Number(q.shippingMinor),
			currency: q.currency,
			taxIncluded: q.taxIncluded,
			observedAt: q.observedAt.toISOString(),
			source: q.source
		};
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
	return sequelize.transaction(async (transaction) => {
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
			const amount = decimalToMinor(data.amount, digits, currency);
			if (!amount.ok) add(issues, 'amount', amount.message);
			else if (amount.amountMinor === 0) add(issues, 'amount', 'The price must be more than zero.');
			else amountMinor = amount.amountMinor;
			if (data.shipping !== undefined) {
				const shipping = decimalToMinor(data.shipping, digits, currency);
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
}

/** Counts for the editor's landing page. */
export async function catalogCounts(): Promise<{
	parts: number;
	stores: number;
	quotes: number;
	regions: number;
}> {
	const [parts, stores, quotes, regions] = await Promise.all([
		Part.count(),
		Store.count(),
		Quote.count(),
		Region.count()
	]);
	return { parts, stores, quotes, regions };
}
