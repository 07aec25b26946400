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
import type { Transaction } from 'sequelize';
import { minorUnitDigits, money } from '$lib/domain/money';
import type { RatesPerEur } from '$lib/domain/region';
import { GUIDES_PER_PAGE } from '$lib/schemas/guide-browse';
import type { GuideBrowseQuery } from '$lib/schemas/guide-browse';
import { Guide, Region, sequelize } from '$lib/server/db';
import type { BrowseItem, BrowseResult, GuideCard } from '$lib/views';
import { regionSummary } from './mappers';
import * as fx from './fx';
import { budgetIn } from '$lib/domain/budget';
import { allRegions } from './reference-cache';
import { containsPattern, ftMinTokenSize, prefixPattern, textSearch } from './text-search';

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
}

interface ListOptions {
	/** Words to find in the published revision's title, summary or build notes. */
	q?: string;
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
	/** Count every match (browse's pages); home and the feed show only their first rows. */
	withTotal?: boolean;
}

/*
 * Every order is on guide_region_prices' own columns, ending in the revision id, so MariaDB
 * reads a page straight off one of its indexes and stops after LIMIT rows (docs/architecture.md
 * "EXPLAIN notes"); a tie-break on a column of guides (the slug, as before) made it join and
 * sort every listed guide on every request.
 */
const ORDER: Record<ListOptions['sort'], string> = {
	newest: 'p.published_at DESC, p.revision_id DESC',
	// Lowest total first, guides without a total last (total_sort), newest first among equals.
	total: 'p.total_sort ASC, p.published_at DESC, p.revision_id DESC',
	// Highest value first, guides without a value last (value_sort), newest first among equals.
	value: 'p.value_sort DESC, p.published_at DESC, p.revision_id DESC'
};

/** How long a list's match count may lag behind (refreshes drop the counts at once). */
const COUNT_TTL_MS = 10_000;
const counts = new Map<string, { at: number; n: Promise<number> }>();

/**
 * The number of guides matching a list's filters: a separate count, kept briefly per filter
 * set, because counting inside the page query (a window function) made MariaDB read every
 * match before LIMIT on every request.
 */
function countMatches(sql: string, replacements: Record<string, unknown>): Promise<number> {
	const { limit: _l, offset: _o, ...filters } = replacements;
	const key = `${sql}\n${JSON.stringify(filters)}`;
	const hit = counts.get(key);
	if (hit && Date.now() - hit.at < COUNT_TTL_MS) return hit.n;
	if (counts.size > 500) counts.clear();
	const n = sequelize
		.query<{ n: number }>(sql, { type: QueryTypes.SELECT, replacements: filters })
		.then((rows) => Number(rows[0]?.n ?? 0));
	counts.set(key, { at: Date.now(), n });
	n.catch(() => counts.delete(key));
	return n;
}

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
	const search = options.q ? await searchJoin(options.q, replacements) : null;
	if (search) where.push(...search.where);
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
		        p.fps_per_100 AS fpsPer100, p.published_at AS publishedAt
		   FROM guide_region_prices p
		   JOIN guides g ON g.id = p.guide_id AND g.published_revision_id = p.revision_id
		   ${search?.join ?? ''}
		   LEFT JOIN users u ON u.id = g.author_id
		  WHERE ${where.join(' AND ')}
		  ORDER BY ${ORDER[options.sort]}
		  LIMIT :limit OFFSET :offset`,
		{ type: QueryTypes.SELECT, replacements }
	);
	const total = options.withTotal
		? await countMatches(
				`SELECT COUNT(*) AS n FROM guide_region_prices p
				   JOIN guides g ON g.id = p.guide_id AND g.published_revision_id = p.revision_id
				   ${search?.join ?? ''}
				  WHERE ${where.join(' AND ')}`,
				replacements
			)
		: rows.length;
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

/**
 * The join and conditions of a text search (text-search.ts): the published revision's title,
 * summary and build notes through its full-text index; words too short for the index as a
 * substring of those rows, or, with no full-text word at all, as the start of the title
 * (the guides_title index; the guide row's title is the published revision's copy).
 */
async function searchJoin(
	q: string,
	replacements: Record<string, unknown>
): Promise<{ join: string; where: string[] }> {
	const { against, shortWords } = textSearch(q, await ftMinTokenSize());
	const where: string[] = [];
	if (against !== '') {
		where.push('MATCH (r.title, r.summary, r.build_notes_md) AGAINST (:against IN BOOLEAN MODE)');
		replacements.against = against;
	}
	shortWords.forEach((word, i) => {
		const key = `short${i}`;
		if (against !== '') {
			replacements[key] = containsPattern(word);
			where.push(
				`(r.title LIKE :${key} OR r.summary LIKE :${key} OR r.build_notes_md LIKE :${key})`
			);
		} else {
			replacements[key] = prefixPattern(word);
			where.push(`g.title LIKE :${key}`);
		}
	});
	return {
		join: against !== '' ? 'JOIN guide_revisions r ON r.id = p.revision_id' : '',
		where
	};
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

/** Drops the cached tag list and match counts (guide-prices.ts calls it after recomputing). */
export function invalidateBrowseTags(): void {
	tagsCache = null;
	counts.clear();
}

/*
 * A guide hidden, restored, unpublished or featured changes what lists count without any
 * price being recomputed: every write to a guide row drops the counts, again when its
 * transaction commits (a read inside it could have cached the old figure).
 */
for (const hook of ['afterSave', 'afterDestroy', 'afterBulkUpdate', 'afterBulkDestroy'] as const) {
	Guide.addHook(hook, `guide-browse-counts-${hook}`, (...args: unknown[]) => {
		const options = (args.length > 1 ? args[1] : args[0]) as
			{ transaction?: Transaction | null } | undefined;
		invalidateBrowseTags();
		options?.transaction?.afterCommit(() => invalidateBrowseTags());
	});
}

/**
 * Every tag of a listed guide, sorted: one query, cached briefly. It walks the distinct tags
 * of guide_tags (its primary key begins with the tag) and, per tag, stops at the first listed
 * guide carrying it, so its cost follows the number of tags, not of guides.
 */
function listedTags(): Promise<string[]> {
	if (tagsCache && Date.now() - tagsCache.at < TAGS_TTL_MS) return tagsCache.tags;
	const tags = sequelize
		.query<{ tag: string }>(
			// A scalar subquery with LIMIT 1, not EXISTS: MariaDB turns EXISTS into a semi-join
			// that reads every guide (EXPLAIN on the bench:scale database); this form runs once
			// per distinct tag and reads one guide_tags row and one guide when the tag is listed.
			`SELECT t.tag FROM (SELECT DISTINCT tag FROM guide_tags) t
			  WHERE (SELECT 1 FROM guide_tags x JOIN guides g ON g.id = x.guide_id
			          WHERE x.tag = t.tag AND g.state = 'published'
			            AND g.published_revision_id IS NOT NULL AND g.hidden_at IS NULL
			          LIMIT 1) IS NOT NULL
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
				q: query.q,
				target,
				baseRegionId: base?.id,
				tags: query.tag,
				// Budget bounds are in the chosen region's currency, so they apply only with a region.
				min: target ? query.min : undefined,
				max: target ? query.max : undefined,
				sort: target ? query.sort : 'newest',
				limit: perPage,
				offset: (query.page - 1) * perPage,
				withTotal: true
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
