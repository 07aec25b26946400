/**
 * Guide browse and the home lists: published guides filtered by tags, base region and a
 * budget in the reader's region, sorted and paged. Pricing goes through guides.getPriced,
 * so a browse total is the very figure the guide page shows for the same region.
 *
 * Cost: with a region chosen every guide left after the tag and base-region filters is
 * priced (a budget, a total or a value sort needs all of them); a guide's frame results
 * come with its pricing (getPriced goes through the guide page). Fine for a community's few hundred
 * guides; a batch pricing call in guides.ts is the next step when that grows.
 */
import { minorUnitDigits } from '$lib/domain/money';
import { GUIDES_PER_PAGE } from '$lib/schemas/guide-browse';
import type { GuideBrowseQuery } from '$lib/schemas/guide-browse';
import * as guides from './guides';
import type { GuideCard, RegionSummary } from './guide-views';

/** A guide on the browse page: its card, with the picks total in the shown region. */
export interface BrowseItem extends GuideCard {
	/** The region `picksTotal` is priced in (the base region when none was chosen). */
	pricedIn: RegionSummary;
	/**
	 * FPS per 100 units of `pricedIn`'s currency, the guide page's own figure (domain/value.ts):
	 * null without frame results, without a complete total, or when no region was chosen.
	 */
	fpsPer100: number | null;
}

export interface BrowseResult {
	items: BrowseItem[];
	total: number;
	page: number;
	pageCount: number;
	/** The reader's region, when one was chosen. */
	region: RegionSummary | null;
	/** Every region, for the form. */
	regions: RegionSummary[];
	/** Every tag used by a published guide, for the form. */
	tags: string[];
}

export type BrowseOutcome =
	{ kind: 'ok'; result: BrowseResult } | { kind: 'unknown_region'; field: 'region' | 'base' };

/** Published guides matching `query`, one page of them. */
export async function browse(
	query: GuideBrowseQuery,
	perPage = GUIDES_PER_PAGE
): Promise<BrowseOutcome> {
	const regions = await guides.listRegions();
	const region = query.region ? (regions.find((r) => r.code === query.region) ?? null) : null;
	if (query.region && !region) return { kind: 'unknown_region', field: 'region' };
	if (query.base && !regions.some((r) => r.code === query.base))
		return { kind: 'unknown_region', field: 'base' };

	const published = await guides.listPublished();
	const tags = [...new Set(published.flatMap((g) => g.tags))].sort();
	const wanted = published
		.filter((g) => !query.base || g.baseRegion.code === query.base)
		.filter((g) => query.tag.every((t) => g.tags.includes(t)))
		.sort(byNewest);

	let items: BrowseItem[];
	if (region) {
		const priced = await Promise.all(wanted.map((g) => inRegion(g, region.code)));
		items = priced
			.filter((g): g is BrowseItem => g !== null)
			.filter((g) => withinBudget(g, query.min, query.max));
		if (query.sort === 'total') items.sort(byTotal);
		if (query.sort === 'value') items.sort(byValue);
	} else {
		items = wanted.map((g) => ({ ...g, pricedIn: g.baseRegion, fpsPer100: null }));
	}

	const total = items.length;
	const pageCount = Math.max(1, Math.ceil(total / perPage));
	const start = (query.page - 1) * perPage;
	return {
		kind: 'ok',
		result: {
			items: items.slice(start, start + perPage),
			total,
			page: query.page,
			pageCount,
			region,
			regions,
			tags
		}
	};
}

/** Home: the newest guides and the featured ones, in their base regions. */
export async function homeLists(
	latestCount = 4
): Promise<{ latest: BrowseItem[]; featured: BrowseItem[] }> {
	const published = (await guides.listPublished())
		.sort(byNewest)
		.map((g) => ({ ...g, pricedIn: g.baseRegion, fpsPer100: null }));
	return { latest: published.slice(0, latestCount), featured: published.filter((g) => g.featured) };
}

async function inRegion(card: GuideCard, regionCode: string): Promise<BrowseItem | null> {
	const outcome = await guides.getPriced(card.slug, regionCode);
	if (outcome.kind !== 'ok') return null;
	const g = outcome.guide;
	// getPriced prices through the guide page, so the value is the one that page shows.
	const fpsPer100 = g.value?.fpsPer100 ?? null;
	return {
		...card,
		picksTotal: g.picksTotal,
		unpricedSlots: g.unpricedSlots,
		pricedIn: g.region,
		fpsPer100
	};
}

/**
 * Budget bounds are whole units of the total's currency. A guide with unpriced slots has
 * no complete total, so it is left out whenever a budget is set.
 */
function withinBudget(item: BrowseItem, min: number | undefined, max: number | undefined): boolean {
	if (min === undefined && max === undefined) return true;
	const total = item.picksTotal;
	if (!total || item.unpricedSlots > 0) return false;
	const scale = 10 ** minorUnitDigits(total.currency);
	if (min !== undefined && total.amountMinor < min * scale) return false;
	if (max !== undefined && total.amountMinor > max * scale) return false;
	return true;
}

function byNewest(a: GuideCard, b: GuideCard): number {
	return b.publishedAt.localeCompare(a.publishedAt) || a.slug.localeCompare(b.slug);
}

/** Lowest total first; guides without a total last, newest first among equals. */
function byTotal(a: BrowseItem, b: BrowseItem): number {
	const x = a.picksTotal?.amountMinor ?? Number.POSITIVE_INFINITY;
	const y = b.picksTotal?.amountMinor ?? Number.POSITIVE_INFINITY;
	if (x !== y) return x < y ? -1 : 1;
	return byNewest(a, b);
}

/** Highest FPS per 100 first; guides without a value (no frame results or no complete total) last, newest first among equals. */
function byValue(a: BrowseItem, b: BrowseItem): number {
	const x = a.fpsPer100 ?? Number.NEGATIVE_INFINITY;
	const y = b.fpsPer100 ?? Number.NEGATIVE_INFINITY;
	if (x !== y) return x > y ? -1 : 1;
	return byNewest(a, b);
}
