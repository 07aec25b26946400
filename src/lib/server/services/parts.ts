/**
 * The public parts catalog as plain objects for pages and the JSON API: search with spec
 * filters, and one part with its quotes, price history and the published guides using it.
 * Read-only; the editor upkeep pages write parts through their own service.
 */
import { Op } from 'sequelize';
import type { PartCategory } from '$lib/domain/types';
import { PARTS_PER_PAGE, SPEC_FILTERS, SPEC_FILTER_KEYS } from '$lib/schemas/parts';
import type { PartSort, SpecFilterDef, SpecFilters } from '$lib/schemas/parts';
import { Guide, GuideSlot, Part, Quote, Region, SlotAlternate, Store } from '$lib/server/db';
import type {
	GuideUse,
	GuideUsingPart,
	PartDetail,
	PartSearchResult,
	PartSummary,
	PriceLine,
	PriceSeries,
	RegionQuotes
} from '$lib/views';
import { regionSummary } from './mappers';
import { pageWindow } from './list-query';
import { byName, byPrice } from './part-rows';
import type { SearchRow } from './part-rows';
import { priceSlotSets } from './pricing';
import { allRegions } from './reference-cache';
import { containsPattern, ftMinTokenSize, prefixPattern, textSearch } from './text-search';

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

/** A part row (model or raw query) as pages and the API show it. */
function toSummary(
	p: Pick<Part, 'id' | 'slug' | 'category' | 'brand' | 'model'> & { specs: unknown }
): PartSummary {
	const { slug, category, brand, model } = p;
	return { id: Number(p.id), slug, category, brand, model, specs: specsOf(p) };
}

/** The region code names no region (the routes answer it as a field error). */
export class UnknownRegionError extends Error {
	constructor(readonly code: string) {
		super(`No region has the code ${code}`);
	}
}

/**
 * The condition "the brand or model of part `p` holds every word of `q`" (null for no
 * words): the full-text terms and the short words of text-search.ts. Shared by the public
 * parts search and the editor's catalog list, so both find the same parts.
 */
export async function partTextWhere(
	q: string
): Promise<{ where: string; replacements: Record<string, unknown> } | null> {
	const conditions: string[] = [];
	const replacements: Record<string, unknown> = {};
	// Each word may sit in the brand or the model, so "halvard 606" finds "Halvard / Strata 606".
	const { against, shortWords } = textSearch(q, await ftMinTokenSize());
	if (against !== '') {
		conditions.push('MATCH (p.brand, p.model) AGAINST (:against IN BOOLEAN MODE)');
		replacements.against = against;
	}
	shortWords.forEach((word, i) => {
		// With full-text terms, a short word filters the rows they found (a substring, cheap).
		// Without any, the first short word is a prefix of the brand or the model (two index
		// ranges, never a table scan) and the others filter what it found as substrings, so
		// "c4 1" still finds "Cindral C4 1 TB".
		const narrowing = against === '' && i === 0;
		replacements[`short${i}`] = narrowing ? prefixPattern(word) : containsPattern(word);
		conditions.push(`(p.brand LIKE :short${i} OR p.model LIKE :short${i})`);
	});
	return conditions.length > 0 ? { where: conditions.join(' AND '), replacements } : null;
}

/**
 * Parts whose brand or model holds every word of `q` (case-insensitive; full-text words
 * match from their start, see text-search.ts), optionally of one category and passing that
 * category's spec filters, by brand and model or by price in `region` (a region code; the
 * price sort needs one). With a region each part carries its price there, priced for the
 * page's parts in one batched pass of the pricing service. `perPage` defaults to 24 and is
 * capped at 100. Throws UnknownRegionError for a region code no region has.
 */
export async function search(options: {
	q: string;
	category?: PartCategory;
	specFilters?: SpecFilters;
	page: number;
	perPage?: number;
	region?: string;
	sort?: PartSort;
}): Promise<PartSearchResult> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage ?? PARTS_PER_PAGE)), 100);
	const filters = activeFilters(options.category, options.specFilters ?? {});
	const region = options.region
		? ((await allRegions()).find((r) => r.code === options.region) ?? null)
		: null;
	if (options.region && !region) throw new UnknownRegionError(options.region);

	const match = { category: options.category, text: await partTextWhere(options.q) };
	// The price sort needs a region (partSearchQuery refuses it without one).
	const source = region && options.sort === 'price' ? byPrice(match, region.id) : byName(match);

	let rows: SearchRow[];
	let total: number;
	let window: ReturnType<typeof pageWindow>;
	if (filters.length === 0) {
		total = await source.count();
		window = pageWindow(total, options.page, perPage);
		rows = await source.page(window.offset, perPage);
	} else {
		/*
		 * Spec filters are applied here in JS, after a query narrowed to one category (the
		 * filters require one) and to the search words, in the page's order. Specs are a JSON
		 * column; past a few thousand parts per category, move the filtered fields to indexed
		 * generated columns and filter in SQL.
		 */
		const matching = (await source.all()).filter((row) =>
			filters.every(({ def, value }) => passes(specsOf(row), def, value))
		);
		total = matching.length;
		window = pageWindow(total, options.page, perPage);
		rows = matching.slice(window.offset, window.offset + perPage);
	}
	const prices = region ? await pricesIn(rows, region) : rows.map(() => null);
	return {
		items: rows.map((row, i) => ({ ...toSummary(row), price: prices[i] ?? null })),
		region: region ? regionSummary(region) : null,
		total,
		page: window.page,
		pageCount: window.pageCount
	};
}

/** Specs as stored; a raw query's JSON column may arrive as text. */
const specsOf = (p: { specs: unknown }): Record<string, unknown> =>
	typeof p.specs === 'string'
		? (JSON.parse(p.specs) as Record<string, unknown>)
		: (p.specs as Record<string, unknown>);

/**
 * Each part's price in `region` through the pricing service, the page's parts in one set:
 * one query for their latest quotes, none per part. The set's base is the region itself, so
 * a part is priced by its latest active quote there (in the region's tax convention) and is
 * unpriced without one: a catalog part has no base region to estimate from.
 */
async function pricesIn(rows: SearchRow[], region: Region): Promise<(PriceLine | null)[]> {
	if (rows.length === 0) return [];
	const run = await priceSlotSets(
		[
			{
				base: region,
				slots: rows.map((row) => ({
					category: row.category,
					quantity: 1,
					pick: { partId: Number(row.id) },
					alternates: []
				}))
			}
		],
		region
	);
	return run.sets[0]?.prices.map((p) => p.pick) ?? rows.map(() => null);
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
