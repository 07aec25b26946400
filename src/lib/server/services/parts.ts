/**
 * The public parts catalog as plain objects for pages and the JSON API: search with spec
 * filters, and one part with its quotes, price history and the published guides using it.
 * Read-only; the editor upkeep pages write parts through their own service.
 */
import { Op } from 'sequelize';
import type { WhereOptions } from 'sequelize';
import type { PartCategory } from '$lib/domain/types';
import { PARTS_PER_PAGE, SPEC_FILTERS, SPEC_FILTER_KEYS } from '$lib/schemas/parts';
import type { SpecFilterDef, SpecFilters } from '$lib/schemas/parts';
import { Guide, GuideSlot, Part, Quote, Region, SlotAlternate, Store } from '$lib/server/db';
import type {
	GuideUse,
	GuideUsingPart,
	PartDetail,
	PartSearchResult,
	PartSummary,
	PriceSeries,
	RegionQuotes
} from '$lib/views';
import { regionSummary } from './mappers';
import { escapeLike, pageWindow } from './list-query';

/** Whether `specs` passes one filter; a missing or mistyped field never passes. */
function passes(
	specs: Record<string, unknown>,
	def: SpecFilterDef,
	value: string | number
): boolean {
	const field = specs[def.field];
	switch (def.op) {
		case 'eq':
			return field === value;
		case 'includes':
			return Array.isArray(field) && field.includes(value);
		case 'min':
			return typeof field === 'number' && field >= Number(value);
		case 'max':
			return typeof field === 'number' && field <= Number(value);
	}
}

/** The filters in force, paired with their definitions for `category`. */
function activeFilters(category: PartCategory | undefined, specFilters: SpecFilters) {
	const active: { def: SpecFilterDef; value: string | number }[] = [];
	for (const key of SPEC_FILTER_KEYS) {
		const value = specFilters[key];
		if (value === undefined) continue;
		const def = category ? SPEC_FILTERS[category]?.find((d) => d.key === key) : undefined;
		// partSearchQuery refuses these; reaching here is a caller's bug, not bad input.
		if (!def)
			throw new RangeError(`Spec filter ${key} does not apply to ${category ?? 'all categories'}`);
		active.push({ def, value });
	}
	return active;
}

const SUMMARY_ATTRIBUTES = ['id', 'slug', 'category', 'brand', 'model', 'specs'] as const;
// Brand and model first; the id tie-break keeps pages stable.
const SUMMARY_ORDER: [string, string][] = [
	['brand', 'ASC'],
	['model', 'ASC'],
	['id', 'ASC']
];

function toSummary(p: Part): PartSummary {
	return { slug: p.slug, category: p.category, brand: p.brand, model: p.model, specs: p.specs };
}

/**
 * Parts whose brand or model contains every word of `q` (case-insensitive, wildcards taken
 * literally), optionally of one category and passing that category's spec filters, by
 * brand and model. `perPage` defaults to 24 and is capped at 100.
 */
export async function search(options: {
	q: string;
	category?: PartCategory;
	specFilters?: SpecFilters;
	page: number;
	perPage?: number;
}): Promise<PartSearchResult> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage ?? PARTS_PER_PAGE)), 100);
	const filters = activeFilters(options.category, options.specFilters ?? {});

	const conditions: WhereOptions<Part>[] = [];
	if (options.category) conditions.push({ category: options.category });
	// Each word may sit in the brand or the model, so "halvard 606" finds "Halvard / Strata 606".
	const words = options.q.trim().split(/\s+/).filter(Boolean).slice(0, 8);
	for (const word of words) {
		const pattern = `%${escapeLike(word)}%`;
		conditions.push({
			[Op.or]: [{ brand: { [Op.like]: pattern } }, { model: { [Op.like]: pattern } }]
		});
	}
	const where: WhereOptions<Part> = conditions.length > 0 ? { [Op.and]: conditions } : {};

	if (filters.length === 0) {
		const total = await Part.count({ where });
		const window = pageWindow(total, options.page, perPage);
		const rows = await Part.findAll({
			where,
			attributes: [...SUMMARY_ATTRIBUTES],
			order: SUMMARY_ORDER,
			limit: perPage,
			offset: window.offset
		});
		return { items: rows.map(toSummary), total, page: window.page, pageCount: window.pageCount };
	}

	/*
	 * Spec filters are applied here in JS, after a query narrowed to one category (the
	 * filters require one) and to the search words. Specs are a JSON column, and the catalog
	 * holds tens to a few thousand parts per category, so this is cheaper to get right than
	 * JSON_VALUE casts in SQL. Past that size, move the filtered fields to indexed generated
	 * columns and filter in SQL.
	 */
	const rows = await Part.findAll({
		where,
		attributes: [...SUMMARY_ATTRIBUTES],
		order: SUMMARY_ORDER
	});
	const matching = rows.filter((row) =>
		filters.every(({ def, value }) => passes(row.specs, def, value))
	);
	const window = pageWindow(matching.length, options.page, perPage);
	return {
		items: matching.slice(window.offset, window.offset + perPage).map(toSummary),
		total: matching.length,
		page: window.page,
		pageCount: window.pageCount
	};
}

type LoadedQuote = Quote & { store: Store; region: Region };

/** The part with its quotes, price history and the published guides using it; null if none. */
export async function getBySlug(slug: string): Promise<PartDetail | null> {
	const part = await Part.findOne({ where: { slug } });
	if (!part) return null;

	// Withdrawn quotes were wrong or retracted: they are neither a price nor history.
	const quotes = (await Quote.findAll({
		where: { partId: part.id, status: { [Op.ne]: 'withdrawn' } },
		include: [
			{ model: Store, as: 'store' },
			{ model: Region, as: 'region' }
		],
		order: [
			['observedAt', 'ASC'],
			['id', 'ASC']
		]
	})) as LoadedQuote[];

	return {
		...toSummary(part),
		quotesByRegion: latestByRegion(quotes),
		history: historyOf(quotes),
		guides: await guidesUsing(part.id)
	};
}

/** `quotes` must be oldest first, so the last one seen per store is its latest. */
function latestByRegion(quotes: LoadedQuote[]): RegionQuotes[] {
	const latest = new Map<string, LoadedQuote>();
	for (const q of quotes) latest.set(`${q.regionId}:${q.storeId}`, q);

	const groups = new Map<number, RegionQuotes>();
	for (const q of latest.values()) {
		let group = groups.get(q.regionId);
		if (!group) {
			group = { region: regionSummary(q.region), quotes: [] };
			groups.set(q.regionId, group);
		}
		group.quotes.push({
			storeName: q.store.name,
			storeUrl: q.store.url,
			price: { amountMinor: Number(q.amountMinor), currency: q.currency },
			shipping: { amountMinor: Number(q.shippingMinor), currency: q.currency },
			taxIncluded: q.taxIncluded,
			observedAt: q.observedAt.toISOString(),
			url: q.url,
			status: q.status
		});
	}
	for (const group of groups.values()) {
		group.quotes.sort(
			(a, b) => a.price.amountMinor - b.price.amountMinor || a.storeName.localeCompare(b.storeName)
		);
	}
	return [...groups.values()].sort((a, b) => a.region.name.localeCompare(b.region.name));
}

/** One series per region, store and currency (a store never mixes currencies on one line). */
function historyOf(quotes: LoadedQuote[]): PriceSeries[] {
	const series = new Map<string, PriceSeries>();
	for (const q of quotes) {
		const key = `${q.regionId}:${q.storeId}:${q.currency}`;
		let line = series.get(key);
		if (!line) {
			line = {
				regionCode: q.region.code,
				regionName: q.region.name,
				storeName: q.store.name,
				currency: q.currency,
				points: []
			};
			series.set(key, line);
		}
		line.points.push({
			observedAt: q.observedAt.toISOString(),
			amountMinor: Number(q.amountMinor)
		});
	}
	return [...series.values()].sort(
		(a, b) =>
			a.currency.localeCompare(b.currency) ||
			a.regionName.localeCompare(b.regionName) ||
			a.storeName.localeCompare(b.storeName)
	);
}

type SlotWithRevision = Pick<GuideSlot, 'revisionId' | 'label' | 'position'>;

/**
 * Published guides whose published revision has the part as a pick or an alternate.
 * Drafts, guides in review, older revisions of a published guide and guides an editor has
 * hidden do not count: a hidden guide's title and link appear nowhere public (issue 12,
 * item 9).
 */
async function guidesUsing(partId: number): Promise<GuideUsingPart[]> {
	const picks = await GuideSlot.findAll({
		where: { pickPartId: partId },
		attributes: ['revisionId', 'label', 'position']
	});
	const alternates = (await SlotAlternate.findAll({
		where: { partId },
		attributes: ['rank'],
		include: [{ model: GuideSlot, as: 'slot', attributes: ['revisionId', 'label', 'position'] }]
	})) as (SlotAlternate & { slot: SlotWithRevision })[];

	const uses: { slot: SlotWithRevision; use: GuideUse }[] = [
		...picks.map((slot) => ({
			slot,
			use: { role: 'pick' as const, slotLabel: slot.label, rank: null }
		})),
		...alternates.map((alt) => ({
			slot: alt.slot,
			use: { role: 'alternate' as const, slotLabel: alt.slot.label, rank: alt.rank }
		}))
	];
	const revisionIds = [...new Set(uses.map((u) => u.slot.revisionId))];
	if (revisionIds.length === 0) return [];

	const guides = await Guide.findAll({
		where: { state: 'published', publishedRevisionId: revisionIds, hiddenAt: null },
		attributes: ['slug', 'title', 'publishedRevisionId']
	});
	return guides
		.map((guide) => ({
			slug: guide.slug,
			title: guide.title,
			uses: uses
				.filter((u) => u.slot.revisionId === guide.publishedRevisionId)
				.sort((a, b) => a.slot.position - b.slot.position || (a.use.rank ?? 0) - (b.use.rank ?? 0))
				.map((u) => u.use)
		}))
		.sort((a, b) => a.title.localeCompare(b.title));
}
