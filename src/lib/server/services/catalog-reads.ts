/**
 * The editor's catalog pages, reading: parts (searched and paged), one part with its specs,
 * stores with their quote counts, the latest quotes, the region choices of the store and
 * quote forms, and the landing page's counts. Changes are catalog-parts.ts's (parts) and
 * catalog-stores.ts's (stores and quotes).
 */
import { QueryTypes } from 'sequelize';
import type { PartCategory } from '$lib/domain/types';
import { EDITOR_PAGE_SIZE } from '$lib/schemas/catalog-upkeep';
import { Part, Quote, Region, Store, sequelize } from '$lib/server/db';
import type {
	EditorPartDetail,
	EditorPartRow,
	EditorQuoteRow,
	EditorRegionOption,
	EditorStoreRow
} from '$lib/views';
import type { Paged } from './audit';
import { pageWindow } from './list-query';
import { partTextWhere } from './parts';
import { prefixPattern } from './text-search';

interface PartListRow {
	id: number;
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	updatedAt: Date | string;
}

/**
 * Parts whose brand and model hold every word of `q` (the public parts search's rule:
 * full-text words from their start, short words as in text-search.ts, wildcards taken
 * literally), or whose slug begins with `q` (pasted from an address, or the first word an
 * import batch's slugs share: a range of the unique slug index); optionally one
 * category; A–Z. Indexed at any catalog size: no LIKE '%q%' over the whole table.
 */
export async function listParts(options: {
	q: string;
	category?: PartCategory;
	page: number;
}): Promise<Paged<EditorPartRow>> {
	const conditions: string[] = [];
	const replacements: Record<string, unknown> = {};
	const q = options.q.trim();
	if (q !== '') {
		const text = await partTextWhere(q);
		conditions.push(text ? `((${text.where}) OR p.slug LIKE :slug)` : 'p.slug LIKE :slug');
		Object.assign(replacements, text?.replacements, { slug: prefixPattern(q) });
	}
	if (options.category) {
		conditions.push('p.category = :category');
		replacements.category = options.category;
	}
	const where = conditions.length > 0 ? conditions.join(' AND ') : '1 = 1';
	const [count] = await sequelize.query<{ n: number }>(
		`SELECT COUNT(*) AS n FROM parts p WHERE ${where}`,
		{ type: QueryTypes.SELECT, replacements }
	);
	const total = Number(count?.n ?? 0);
	const window = pageWindow(total, options.page, EDITOR_PAGE_SIZE);
	const rows = await sequelize.query<PartListRow>(
		`SELECT p.id, p.category, p.brand, p.model, p.slug, p.updated_at AS updatedAt
		   FROM parts p WHERE ${where}
		  ORDER BY p.brand, p.model, p.id LIMIT :limit OFFSET :offset`,
		{
			type: QueryTypes.SELECT,
			replacements: { ...replacements, limit: EDITOR_PAGE_SIZE, offset: window.offset }
		}
	);
	return {
		items: rows.map((r) => toPartRow({ ...r, id: Number(r.id), updatedAt: new Date(r.updatedAt) })),
		total,
		page: window.page,
		perPage: EDITOR_PAGE_SIZE,
		pageCount: window.pageCount
	};
}

/** One part with its specs, for the edit form; null when no part has that slug. */
export async function getPart(slug: string): Promise<EditorPartDetail | null> {
	const part = await Part.findOne({ where: { slug } });
	return part ? { ...toPartRow(part), specs: part.specs } : null;
}

/** A part as the editor's lists show it. */
export function toPartRow(
	part: Pick<Part, 'id' | 'category' | 'brand' | 'model' | 'slug' | 'updatedAt'>
): EditorPartRow {
	return {
		id: part.id,
		category: part.category,
		brand: part.brand,
		model: part.model,
		slug: part.slug,
		updatedAt: part.updatedAt.toISOString()
	};
}

/** Regions for the store and quote forms, by name. */
export async function regionOptions(): Promise<EditorRegionOption[]> {
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
export async function listStores(): Promise<EditorStoreRow[]> {
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

/** The latest quotes, newest observation first; only one part's when `partSlug` is given. */
export async function listRecentQuotes(
	options: { limit?: number; partSlug?: string } = {}
): Promise<EditorQuoteRow[]> {
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
			source: q.source,
			status: q.status
		};
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
