/**
 * Lists of published guides: the cards of browse, the home page and the Atom feed. Guides
 * browse filtered by tags, base region and a budget in the reader's region, sorted and paged.
 *
 * Every list is priced in one batched pass of the pricing service (services/pricing.ts), the
 * same computation as the guide page, so a browse total is the very figure the guide page
 * shows for the same region: a constant number of queries however many guides there are
 * (tests/integration/pricing.spec.ts counts them). Every published guide is still priced on
 * each request; stored totals per revision and region are the next step when that grows.
 */
import { Op } from 'sequelize';
import { minorUnitDigits } from '$lib/domain/money';
import { valueOf } from '$lib/domain/value';
import { GUIDES_PER_PAGE } from '$lib/schemas/guide-browse';
import type { GuideBrowseQuery } from '$lib/schemas/guide-browse';
import { FrameResult, Guide, Region } from '$lib/server/db';
import type { BrowseItem, BrowseResult, GuideCard } from '$lib/views';
import * as guides from './guides';
import type { LoadedGuide } from './guides';
import { regionSummary } from './mappers';
import { priceRevisionsIn } from './pricing';

/** Published guides, featured first, newest first, priced in their base regions. */
export async function listPublished(): Promise<GuideCard[]> {
	return (await publishedIn(null)).map(
		({ pricedIn: _p, fpsPer100: _v, budgetInRegion: _b, ...card }) => card
	);
}

/**
 * Every published guide's card priced in `target` (null: each in its base region), with the
 * value in that region when one was chosen. Featured first, then the most recently changed.
 */
async function publishedIn(target: Region | null): Promise<BrowseItem[]> {
	const rows = (await Guide.findAll({
		// Hidden guides (services/content-reports) are left out of every public list.
		where: { state: 'published', publishedRevisionId: { [Op.ne]: null }, hiddenAt: null },
		include: guides.guideIncludes(),
		order: [
			['featured', 'DESC'],
			['updatedAt', 'DESC']
		]
	})) as LoadedGuide[];
	const listed = rows.flatMap((guide) =>
		guide.baseRegion && guide.publishedRevision
			? [{ guide, base: guide.baseRegion, revision: guide.publishedRevision }]
			: []
	);
	const revisionIds = listed.map((g) => g.revision.id);
	const [pricing, frames] = await Promise.all([
		priceRevisionsIn(
			listed.map((g) => ({ revisionId: g.revision.id, base: g.base })),
			target
		),
		// Value is shown only in a chosen region (the guide page's figure for that region).
		target && revisionIds.length > 0
			? FrameResult.findAll({
					where: { revisionId: revisionIds },
					attributes: ['revisionId', 'avgFpsTenths']
				})
			: Promise.resolve([])
	]);
	return listed.flatMap(({ guide, base, revision }) => {
		const priced = pricing.revisions.get(revision.id);
		if (!priced) return [];
		const { adjustment, region } = priced;
		let fpsPer100: number | null = null;
		if (target) {
			// As on the guide page: value only against a complete total.
			const total = adjustment.unpricedSlots === 0 ? adjustment.picksTotal : null;
			const results = frames
				.filter((f) => f.revisionId === revision.id)
				.map((f) => ({ averageFps: f.avgFpsTenths / 10 }));
			fpsPer100 = valueOf(results, total).fpsPer100;
		}
		const card = guides.cardOf(guide, base, revision, adjustment);
		return [
			{
				...card,
				pricedIn: regionSummary(region),
				// One currency on a card: the budget in the currency the total is priced in.
				budgetInRegion: guides.budgetIn(card.targetBudget, region.currency, pricing.rates).money,
				fpsPer100
			}
		];
	});
}

export type BrowseOutcome =
	{ kind: 'ok'; result: BrowseResult } | { kind: 'unknown_region'; field: 'region' | 'base' };

/** Published guides matching `query`, one page of them. */
export async function browse(
	query: GuideBrowseQuery,
	perPage = GUIDES_PER_PAGE
): Promise<BrowseOutcome> {
	const regionRows = await Region.findAll({ order: [['name', 'ASC']] });
	const target = query.region ? (regionRows.find((r) => r.code === query.region) ?? null) : null;
	if (query.region && !target) return { kind: 'unknown_region', field: 'region' };
	if (query.base && !regionRows.some((r) => r.code === query.base))
		return { kind: 'unknown_region', field: 'base' };

	const published = await publishedIn(target);
	const tags = [...new Set(published.flatMap((g) => g.tags))].sort();
	let items = published
		.filter((g) => !query.base || g.baseRegion.code === query.base)
		.filter((g) => query.tag.every((t) => g.tags.includes(t)))
		.sort(byNewest);
	if (target) {
		// Budget bounds are in the chosen region's currency, so they apply only with a region.
		items = items.filter((g) => withinBudget(g, query.min, query.max));
		if (query.sort === 'total') items.sort(byTotal);
		if (query.sort === 'value') items.sort(byValue);
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
			region: target ? regionSummary(target) : null,
			regions: regionRows.map(regionSummary),
			tags
		}
	};
}

/**
 * Home, in base regions. Two lists with rules of their own, so no guide shows twice:
 * "Featured" is what editors picked; "New" is the newest of the rest.
 */
export async function homeLists(
	latestCount = 4
): Promise<{ latest: BrowseItem[]; featured: BrowseItem[] }> {
	const published = (await publishedIn(null)).sort(byNewest);
	return {
		latest: published.filter((g) => !g.featured).slice(0, latestCount),
		featured: published.filter((g) => g.featured)
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
