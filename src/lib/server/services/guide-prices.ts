/**
 * Stored priced totals, ranges and value of every published revision in every region (the
 * guide_region_prices table). Lists (browse, home, GET /api/v1/guides, the feed) read them
 * with one indexed query per page (guide-browse.ts), so a page costs the same with 10 guides
 * or 10,000. The work is done when the inputs change, not when pages are read:
 *
 * - a revision is published (guide-reviews.ts decide): that revision, in every region;
 * - a quote is accepted (an editor's quote, a verified sighting, a catalog import): every
 *   published revision that uses the part as a pick or an alternate;
 * - exchange rates are refreshed or a region's tax or factors change: everything, in the
 *   background after the answer (refreshAllLater).
 *
 * The figures come from the one pricing service (pricing.ts), the same computation as the
 * guide page, so a stored total is the figure the guide page shows for that region: the few
 * revisions of an event through its own loading (priceRevisionsIn), the full pass over every
 * revision through typed raw rows loaded once per page (price-pass-loads.ts) and the same
 * computation in memory (priceLoadedSets); tests compare the two row for row.
 * The same pass recomputes the guides' upkeep alerts (upkeep-alerts.ts) from these figures.
 * Recomputation runs right after the triggering transaction commits (pricing reads through
 * the pool, so it must see the committed quote or revision); it replaces a revision's rows
 * in one transaction of its own, so a reader never sees half a revision. Each recomputation
 * then bumps the guide view counter (guide-view-cache.ts), so cached guide pages, pricing
 * answers and their ETags follow in every app process.
 */
import { QueryTypes } from 'sequelize';
import type { RatesPerEur } from '$lib/domain/region';
import { valueOf } from '$lib/domain/value';
import { FrameResult, Region, sequelize } from '$lib/server/db';
import { bumpGuideViews } from './cache-generations';
import * as fx from './fx';
import { invalidateBrowseTags } from './guide-browse';
import { loadLatestQuotes, loadPassSlots } from './price-pass-loads';
import { priceLoadedSets, priceRevisionsIn, revisionSlotToPrice } from './pricing';
import type { PricedSet } from './pricing';
import { refreshAlerts, sweepAlerts } from './upkeep-alerts';
import type { RevisionPriced } from './upkeep-alerts';
import { runLater } from '$lib/server/background';

/** Revisions priced per batch: bounds memory (slots and quotes of a batch) at any scale. */
const BATCH = 250;
/** total_sort for a revision without any total: after every real amount. */
const NO_TOTAL = '9000000000000000000';

interface CurrentRevision {
	revisionId: number;
	guideId: number;
	baseRegionId: number;
	publishedAt: Date;
}

/** Recomputes the stored figures of these revisions (those still a guide's published one). */
export async function refreshRevisions(revisionIds: readonly number[]): Promise<void> {
	const ids = [...new Set(revisionIds)];
	if (ids.length === 0) return;
	// Fresh reads, not the reference cache: this runs right after the write that changed them.
	const regions = await Region.findAll();
	for (let i = 0; i < ids.length; i += BATCH)
		await refreshBatch(ids.slice(i, i + BATCH), regions, pricedLikeGuidePage);
	// The same events change the cached guide pages and pricing answers, in every process.
	await bumpGuideViews();
}

/** Recomputes every published revision that uses one of these parts (pick or alternate). */
export async function refreshForParts(partIds: readonly number[]): Promise<void> {
	if (partIds.length === 0) return;
	const rows = await sequelize.query<{ id: number }>(
		`SELECT g.published_revision_id AS id
		   FROM guide_slots s JOIN guides g ON g.published_revision_id = s.revision_id
		  WHERE s.pick_part_id IN (:parts)
		 UNION
		 SELECT g.published_revision_id AS id
		   FROM slot_alternates a
		   JOIN guide_slots s ON s.id = a.slot_id
		   JOIN guides g ON g.published_revision_id = s.revision_id
		  WHERE a.part_id IN (:parts)`,
		{ type: QueryTypes.SELECT, replacements: { parts: [...new Set(partIds)] } }
	);
	await refreshRevisions(rows.map((r) => Number(r.id)));
}

/** refreshForParts for the parts of these quotes (just accepted). */
export async function refreshForQuotes(quoteIds: readonly number[]): Promise<void> {
	if (quoteIds.length === 0) return;
	const rows = await sequelize.query<{ partId: number }>(
		'SELECT DISTINCT part_id AS partId FROM quotes WHERE id IN (:ids)',
		{ type: QueryTypes.SELECT, replacements: { ids: [...quoteIds] } }
	);
	await refreshForParts(rows.map((r) => Number(r.partId)));
}

/**
 * Recomputes every published revision, page by page (rates refreshed, a region changed, the
 * seeders, a repair, the scheduler's daily pass). Rows of revisions that are no longer
 * published are dropped; `now` is the moment upkeep alerts are judged at (quote ages). Set-based:
 * per page of `batch` revisions a few raw queries, pricing in memory for every region, and
 * multi-row writes; memory holds one page's slots and quotes at a time. `batch` is for tests
 * that need page boundaries among a few guides.
 */
export async function refreshAll(options: { batch?: number; now?: Date } = {}): Promise<void> {
	const batch = options.batch ?? BATCH;
	const now = options.now ?? new Date();
	await sequelize.query(
		`DELETE p FROM guide_region_prices p
		   LEFT JOIN guides g ON g.published_revision_id = p.revision_id
		  WHERE g.id IS NULL`,
		{ type: QueryTypes.DELETE }
	);
	await sweepAlerts();
	// Read once for the whole pass: every page is priced in every region at the same rates.
	const [regions, rates] = await Promise.all([Region.findAll(), fx.ratesForPricing()]);
	const setBased = pricedSetBased(rates);
	let after = 0;
	for (;;) {
		const rows = await sequelize.query<{ id: number }>(
			`SELECT published_revision_id AS id FROM guides
			  WHERE published_revision_id > :after ORDER BY published_revision_id LIMIT :limit`,
			{ type: QueryTypes.SELECT, replacements: { after, limit: batch } }
		);
		if (rows.length === 0) break;
		await refreshBatch(
			rows.map((r) => Number(r.id)),
			regions,
			setBased,
			false,
			now
		);
		after = Number(rows[rows.length - 1]?.id);
	}
	// Once for the whole pass, not per page: each move drops every process's guide views and
	// kept answers, and a pass of 10,000 guides has 40 pages. The lists read the new figures
	// from the next request on.
	await bumpGuideViews();
}

/*
 * refreshAll for a change that needs no answer from it (rates refreshed, a region's tax or
 * factors changed, a pairing rule written): it runs after the request has been answered,
 * since its cost grows with the number of published guides. Changes that arrive while a
 * pass runs ask for one more pass, not one each. Until it ends, lists and guide pages show
 * the previous figures.
 */
let fullPass: 'idle' | 'running' | 'again' = 'idle';

/** Read through a call: the pass awaited in between may have changed it. */
function anotherPassAsked(): boolean {
	return fullPass === 'again';
}

export function refreshAllLater(): void {
	if (fullPass !== 'idle') {
		fullPass = 'again';
		return;
	}
	fullPass = 'running';
	runLater('guide-prices-refresh-all', async () => {
		try {
			do {
				fullPass = 'running';
				await refreshAll();
			} while (anotherPassAsked());
		} finally {
			fullPass = 'idle';
		}
	});
}

type Listed = CurrentRevision & { base: Region };
interface Priced {
	slots: RevisionPriced['slots'];
	byRegion: Map<number, Pick<PricedSet, 'adjustment'>>;
}
/** Each listed revision's slots and its pricing in every region. */
type Pricer = (
	listed: readonly Listed[],
	regions: readonly Region[]
) => Promise<Map<number, Priced>>;

/**
 * The guide page's own path (pricing.ts priceRevisionsIn, region by region): for the few
 * revisions an approval or an accepted quote touches.
 */
const pricedLikeGuidePage: Pricer = async (listed, regions) => {
	const out = new Map<number, Priced>();
	for (const region of regions) {
		const pricing = await priceRevisionsIn(
			listed.map((c) => ({ revisionId: c.revisionId, base: c.base })),
			region
		);
		for (const [revisionId, priced] of pricing.revisions) {
			const entry = out.get(revisionId) ?? { slots: priced.slots, byRegion: new Map() };
			entry.byRegion.set(region.id, priced);
			out.set(revisionId, entry);
		}
	}
	return out;
};

/**
 * The full pass's path: a page's slots and the latest quotes of every part in it in every
 * region read once as raw rows (price-pass-loads.ts), then the same pricing computation
 * (pricing.ts priceLoadedSets) per region in memory. Same figures, a few queries per page.
 */
function pricedSetBased(rates: RatesPerEur): Pricer {
	return async (listed, regions) => {
		const slots = await loadPassSlots(listed.map((c) => c.revisionId));
		const slotsOf = new Map<number, typeof slots>();
		const partIds = new Set<number>();
		for (const slot of slots) {
			const list = slotsOf.get(slot.revisionId) ?? [];
			list.push(slot);
			slotsOf.set(slot.revisionId, list);
			partIds.add(slot.pickPartId);
			for (const a of slot.alternates) partIds.add(a.partId);
		}
		const quotes = await loadLatestQuotes([...partIds]);
		const sets = listed.map((c) => ({
			base: c.base,
			slots: (slotsOf.get(c.revisionId) ?? []).map(revisionSlotToPrice)
		}));
		const out = new Map<number, Priced>(
			listed.map((c) => [
				c.revisionId,
				{ slots: slotsOf.get(c.revisionId) ?? [], byRegion: new Map() }
			])
		);
		for (const region of regions)
			priceLoadedSets(sets, region, quotes, rates).forEach((set, i) => {
				const c = listed[i];
				if (c) out.get(c.revisionId)?.byRegion.set(region.id, set);
			});
		return out;
	};
}

/** `sweep`: false in the full pass, which sweeps stale alerts once before its pages. */
async function refreshBatch(
	revisionIds: number[],
	regions: readonly Region[],
	priceAll: Pricer,
	sweep = true,
	now = new Date()
): Promise<void> {
	if (revisionIds.length === 0) return;
	const current = (
		await sequelize.query<CurrentRevision>(
			`SELECT r.id AS revisionId, g.id AS guideId, g.base_region_id AS baseRegionId,
			        COALESCE(r.published_at, g.updated_at) AS publishedAt
			   FROM guide_revisions r JOIN guides g ON g.published_revision_id = r.id
			  WHERE r.id IN (:ids)`,
			{ type: QueryTypes.SELECT, replacements: { ids: revisionIds } }
		)
	).map((r) => ({
		revisionId: Number(r.revisionId),
		guideId: Number(r.guideId),
		baseRegionId: Number(r.baseRegionId),
		publishedAt: new Date(r.publishedAt)
	}));
	const regionById = new Map(regions.map((r) => [r.id, r]));
	const listed = current.flatMap((c) => {
		const base = regionById.get(c.baseRegionId);
		return base ? [{ ...c, base }] : [];
	});
	const [priced, frames] = await Promise.all([
		priceAll(listed, regions),
		FrameResult.findAll({
			where: { revisionId: current.map((c) => c.revisionId) },
			attributes: ['revisionId', 'avgFpsTenths'],
			raw: true
		})
	]);
	const framesOf = new Map<number, { averageFps: number }[]>();
	for (const f of frames) {
		const list = framesOf.get(f.revisionId) ?? [];
		list.push({ averageFps: f.avgFpsTenths / 10 });
		framesOf.set(f.revisionId, list);
	}
	const values: unknown[][] = [];
	for (const region of regions) {
		for (const c of listed) {
			const inRegion = priced.get(c.revisionId)?.byRegion.get(region.id);
			if (!inRegion) continue;
			const { adjustment } = inRegion;
			// As on the guide page: value only against a complete total.
			const complete = adjustment.unpricedSlots === 0 ? adjustment.picksTotal : null;
			const fpsPer100 = valueOf(framesOf.get(c.revisionId) ?? [], complete).fpsPer100;
			const total = adjustment.picksTotal?.amountMinor ?? null;
			values.push([
				c.revisionId,
				region.id,
				c.guideId,
				region.id === c.baseRegionId ? 1 : 0,
				region.currency,
				total,
				adjustment.unpricedSlots,
				adjustment.range?.min.amountMinor ?? null,
				adjustment.range?.max.amountMinor ?? null,
				fpsPer100,
				total ?? NO_TOTAL,
				fpsPer100 ?? -1,
				c.publishedAt,
				now
			]);
		}
	}
	const guideIds = [...new Set(current.map((c) => c.guideId))];
	await sequelize.transaction(async (transaction) => {
		// A guide's older revisions leave the lists with their rows.
		await sequelize.query(
			`DELETE FROM guide_region_prices WHERE revision_id IN (:ids)${
				guideIds.length > 0 ? ' OR guide_id IN (:guides)' : ''
			}`,
			{ type: QueryTypes.DELETE, replacements: { ids: revisionIds, guides: guideIds }, transaction }
		);
		for (let i = 0; i < values.length; i += 500) {
			const chunk = values.slice(i, i + 500);
			await sequelize.query(
				`INSERT INTO guide_region_prices
				   (revision_id, region_id, guide_id, is_base, currency, picks_total_minor,
				    unpriced_slots, range_min_minor, range_max_minor, fps_per_100, total_sort,
				    value_sort, published_at, computed_at)
				 VALUES ${chunk.map(() => '(?)').join(', ')}`,
				{ type: QueryTypes.INSERT, replacements: chunk, transaction }
			);
		}
	});
	invalidateBrowseTags();
	await refreshAlerts(
		listed.map((c) => ({
			revisionId: c.revisionId,
			guideId: c.guideId,
			baseRegionId: c.baseRegionId,
			slots: priced.get(c.revisionId)?.slots ?? [],
			byRegion: priced.get(c.revisionId)?.byRegion ?? new Map()
		})),
		regions,
		{ sweep, now }
	);
}
