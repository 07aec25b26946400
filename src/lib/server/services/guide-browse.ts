/**
 * Lists of published guides: the cards of browse, the home page, GET /api/v1/guides and the
 * Atom feed. Guides browse filtered by tags, base region and a budget in the reader's region,
 * sorted and paged.
 *
 * Every list reads the stored figures of guide_region_prices (guide-prices.ts keeps them
 * when revisions are published, quotes accepted or rates refreshed): one indexed query per
 * page, paged in the database, so a page costs the same with 10 guides or 10,000 and no
 * request loads every guide. The stored figures come from the pricing service, so a browse
 * total is the very figure the guide page shows for the same region.
 */
import { QueryTypes } from 'sequelize';
import { minorUnitDigits, money } from '$lib/domain/money';
import type { RatesPerEur } from '$lib/domain/region';
import { GUIDES_PER_PAGE } from '$lib/schemas/guide-browse';
import type { GuideBrowseQuery } from '$lib/schemas/guide-browse';
import { Region, sequelize } from '$lib/server/db';
import type { BrowseItem, BrowseResult, GuideCard } from '$lib/views';
import { regionSummary } from './mappers';
import * as fx from './fx';
import { budgetIn } from './guides';
import { allRegions } from './reference-cache';

/** One stored row joined with its guide: exactly what a card shows. */
interface ListedRow {
	slug: string;
	title: string;
	summary: string;
	tags: string[] | string;
	featured: number | boolean;
	targetBudgetMinor: number | string;
	baseRegionId: number;
	authorName: string | null;
	regionId: number;
	picksTotalMinor: number | string | null;
	unpricedSlots: number;
	fpsPer100: number | null;
	publishedAt: Date | string;
	fullCount: number | string;
}

interface ListOptions {
	/** Priced in this region; null: each guide in its own base region. */
	target: Region | null;
	baseRegionId?: number;
	tags?: readonly string[];
	featuredOnly?: boolean;
	/** Home's "New": leave out what editors featured, so no guide shows in both lists. */
	notFeatured?: boolean;
	/** Whole units of the target's currency; only with a target. */
	min?: number;
	max?: number;
	sort: 'newest' | 'total' | 'value';
	limit: number;
	offset: number;
}

const ORDER: Record<ListOptions['sort'], string> = {
	newest: 'p.published_at DESC, g.slug ASC',
	// Lowest total first, guides without a total last (total_sort), newest first among equals.
	total: 'p.total_sort ASC, p.published_at DESC, g.slug ASC',
	// Highest value first, guides without a value last (value_sort), newest first among equals.
	value: 'p.value_sort DESC, p.published_at DESC, g.slug ASC'
};

/**
 * One page of listed guides and the number of all that match, in one query: the stored rows
 * of the region (or of each base region), joined with their guide where that revision is
 * still the published one and the guide is listed (published, not hidden).
 */
async function listPage(
	options: ListOptions,
	regionById: Map<number, Region>
): Promise<{ items: BrowseItem[]; total: number }> {
	const where: string[] = [
		options.target ? 'p.region_id = :regionId' : 'p.is_base = 1',
		"g.state = 'published'",
		'g.hidden_at IS NULL'
	];
	const replacements: Record<string, unknown> = {
		regionId: options.target?.id ?? 0,
		limit: options.limit,
		offset: options.offset
	};
	if (options.baseRegionId !== undefined) {
		where.push('g.base_region_id = :baseRegionId');
		replacements.baseRegionId = options.baseRegionId;
	}
	(options.tags ?? []).forEach((tag, i) => {
		where.push(`JSON_CONTAINS(g.tags, JSON_QUOTE(:tag${i}))`);
		replacements[`tag${i}`] = tag;
	});
	if (options.featuredOnly) where.push('g.featured = 1');
	if (options.notFeatured) where.push('g.featured = 0');
	if (options.target && (options.min !== undefined || options.max !== undefined)) {
		// A guide with unpriced slots has no complete total, so a budget leaves it out.
		const scale = 10 ** minorUnitDigits(options.target.currency);
		where.push('p.unpriced_slots = 0', 'p.picks_total_minor IS NOT NULL');
		if (options.min !== undefined) {
			where.push('p.picks_total_minor >= :min');
			replacements.min = options.min * scale;
		}
		if (options.max !== undefined) {
			where.push('p.picks_total_minor <= :max');
			replacements.max = options.max * scale;
		}
	}
	const rows = await sequelize.query<ListedRow>(
		`SELECT g.slug, g.title, g.summary, g.tags, g.featured,
		        g.target_budget_minor AS targetBudgetMinor, g.base_region_id AS baseRegionId,
		        u.name AS authorName, p.region_id AS regionId,
		        p.picks_total_minor AS picksTotalMinor, p.unpriced_slots AS unpricedSlots,
		        p.fps_per_100 AS fpsPer100, p.published_at AS publishedAt,
		        COUNT(*) OVER () AS fullCount
		   FROM guide_region_prices p
		   JOIN guides g ON g.id = p.guide_id AND g.published_revision_id = p.revision_id
		   LEFT JOIN users u ON u.id = g.author_id
		  WHERE ${where.join(' AND ')}
		  ORDER BY ${ORDER[options.sort]}
		  LIMIT :limit OFFSET :offset`,
		{ type: QueryTypes.SELECT, replacements }
	);
	let total = Number(rows[0]?.fullCount ?? 0);
	if (rows.length === 0 && options.offset > 0) {
		// Past the last page the window count has no row to ride on; count separately.
		const [count] = await sequelize.query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM guide_region_prices p
			   JOIN guides g ON g.id = p.guide_id AND g.published_revision_id = p.revision_id
			  WHERE ${where.join(' AND ')}`,
			{ type: QueryTypes.SELECT, replacements }
		);
		total = Number(count?.n ?? 0);
	}
	// One currency on a card: the budget converted into the currency its total is priced in.
	const crosses = rows.some(
		(row) =>
			regionById.get(Number(row.baseRegionId))?.currency !==
			regionById.get(Number(row.regionId))?.currency
	);
	const rates = crosses ? await fx.ratesForPricing() : ({} as RatesPerEur);
	const items = rows.flatMap((row) => {
		const base = regionById.get(Number(row.baseRegionId));
		const region = regionById.get(Number(row.regionId));
		return base && region ? [itemOf(row, base, region, options.target !== null, rates)] : [];
	});
	return { items, total };
}

function itemOf(
	row: ListedRow,
	base: Region,
	region: Region,
	withValue: boolean,
	rates: RatesPerEur
): BrowseItem {
	const targetBudget = money(Number(row.targetBudgetMinor), base.currency);
	const tags = typeof row.tags === 'string' ? (JSON.parse(row.tags) as string[]) : row.tags;
	return {
		slug: row.slug,
		title: row.title,
		summary: row.summary,
		authorName: row.authorName ?? 'Former member',
		targetBudget,
		budgetInRegion: budgetIn(targetBudget, region.currency, rates).money,
		baseRegion: regionSummary(base),
		tags,
		featured: Boolean(row.featured),
		picksTotal:
			row.picksTotalMinor === null ? null : money(Number(row.picksTotalMinor), region.currency),
		unpricedSlots: Number(row.unpricedSlots),
		publishedAt: new Date(row.publishedAt).toISOString(),
		pricedIn: regionSummary(region),
		// Value is shown only in a chosen region (the guide page's figure for that region).
		fpsPer100: withValue && row.fpsPer100 !== null ? Number(row.fpsPer100) : null
	};
}

async function regionsById(): Promise<{ rows: Region[]; byId: Map<number, Region> }> {
	const rows = await allRegions();
	return { rows, byId: new Map(rows.map((r) => [r.id, r])) };
}

/** The newest published guides in their base regions (the Atom feed and plain lists). */
export async function listPublished(limit = 100): Promise<GuideCard[]> {
	const { byId } = await regionsById();
	const { items } = await listPage({ target: null, sort: 'newest', limit, offset: 0 }, byId);
	return items.map(({ pricedIn: _p, fpsPer100: _v, budgetInRegion: _b, ...card }) => card);
}

/** Tags change only when guides are published or hidden; the form's list may lag a little. */
const TAGS_TTL_MS = 10_000;
let tagsCache: { at: number; tags: Promise<string[]> } | null = null;

/** Drops the cached tag list (guide-prices.ts calls it after recomputing). */
export function invalidateBrowseTags(): void {
	tagsCache = null;
}

/** Every tag of a listed guide, sorted: one query, cached briefly. */
function listedTags(): Promise<string[]> {
	if (tagsCache && Date.now() - tagsCache.at < TAGS_TTL_MS) return tagsCache.tags;
	const tags = sequelize
		.query<{ tag: string }>(
			`SELECT DISTINCT t.tag FROM guides g,
			        JSON_TABLE(g.tags, '$[*]' COLUMNS (tag VARCHAR(64) PATH '$')) t
			  WHERE g.state = 'published' AND g.published_revision_id IS NOT NULL
			    AND g.hidden_at IS NULL
			  ORDER BY t.tag`,
			{ type: QueryTypes.SELECT }
		)
		.then((rows) => rows.map((r) => r.tag));
	tagsCache = { at: Date.now(), tags };
	tags.catch(() => (tagsCache = null));
	return tags;
}

export type BrowseOutcome =
	{ kind: 'ok'; result: BrowseResult } | { kind: 'unknown_region'; field: 'region' | 'base' };

/** Published guides matching `query`, one page of them. */
export async function browse(
	query: GuideBrowseQuery,
	perPage = GUIDES_PER_PAGE
): Promise<BrowseOutcome> {
	const { rows: regionRows, byId } = await regionsById();
	const target = query.region ? (regionRows.find((r) => r.code === query.region) ?? null) : null;
	if (query.region && !target) return { kind: 'unknown_region', field: 'region' };
	const base = query.base ? regionRows.find((r) => r.code === query.base) : undefined;
	if (query.base && !base) return { kind: 'unknown_region', field: 'base' };

	const [{ items, total }, tags] = await Promise.all([
		listPage(
			{
				target,
				baseRegionId: base?.id,
				tags: query.tag,
				// Budget bounds are in the chosen region's currency, so they apply only with a region.
				min: target ? query.min : undefined,
				max: target ? query.max : undefined,
				sort: target ? query.sort : 'newest',
				limit: perPage,
				offset: (query.page - 1) * perPage
			},
			byId
		),
		listedTags()
	]);
	const pageCount = Math.max(1, Math.ceil(total / perPage));
	return {
		kind: 'ok',
		result: {
			items,
			total,
			page: query.page,
			pageCount,
			region: target ? regionSummary(target) : null,
			regions: regionRows.map(regionSummary),
			tags
		}
	};
}

/** Home: the newest guides and the featured ones (at most 24), in their base regions. */
export async function homeLists(
	latestCount = 4
): Promise<{ latest: BrowseItem[]; featured: BrowseItem[] }> {
	const { byId } = await regionsById();
	const [latest, featured] = await Promise.all([
		listPage(
			{ target: null, sort: 'newest', notFeatured: true, limit: latestCount, offset: 0 },
			byId
		),
		listPage({ target: null, sort: 'newest', featuredOnly: true, limit: 24, offset: 0 }, byId)
	]);
	return { latest: latest.items, featured: featured.items };
}
