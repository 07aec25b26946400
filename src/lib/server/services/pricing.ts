/**
 * The one pricing service (docs/architecture.md Computations 2). Guides, builds, browse, the
 * Atom feed and the API price through it, so a total is the same figure wherever it shows.
 *
 * It takes sets of slots (each slot: the pick, with the quote its author chose, and the
 * alternates) with the base region each set's prices start from, and a target region, and
 * answers every set in one batched pass: one query for the latest quotes of every part in
 * every base region and the target region, the exchange rates once (only when some set
 * crosses regions), then domain/region.ts adjustToRegion per set, which does all the
 * arithmetic. `priceRevisions` does the same for published revisions by id, with one more
 * query for their slots; many revisions cost no more queries than one.
 *
 * The rules it loads for (the domain computes):
 * - a pick's base price is the quote its author chose when that quote is in the base region,
 *   else the part's latest active quote there; an alternate's is always the latest;
 * - in the base region itself that base price is the quote shown; elsewhere the latest
 *   active quote in the target region wins, and without one the base price is estimated;
 * - "latest" is the newest observation, the newest row among equal dates.
 */
import { money } from '$lib/domain/money';
import { adjustToRegion } from '$lib/domain/region';
import type {
	OptionInput,
	PricedLine,
	QuoteInput,
	RatesPerEur,
	RegionAdjustment,
	RegionPricing
} from '$lib/domain/region';
import type { PartCategory } from '$lib/domain/types';
import { Guide, GuideRevision, Quote, Region, Store } from '$lib/server/db';
import type { PriceLine } from '$lib/views';
import * as fx from './fx';
import { loadRevisionSlots } from './revision-snapshots';
import type { LoadedRevisionSlot, QuoteWithStore } from './revision-snapshots';

/** The quote an author chose for a pick, as pricing reads it (a model row or a raw row). */
export type ChosenQuote = Pick<
	QuoteWithStore,
	'regionId' | 'amountMinor' | 'currency' | 'taxIncluded' | 'observedAt'
> & { store: Pick<QuoteWithStore['store'], 'name'> };

/** One option of a slot: a catalog part and, for an author's pick, the quote they chose. */
export interface OptionToPrice {
	partId: number;
	chosenQuote?: ChosenQuote | null;
}

/** A revision's slot as pricing reads it: LoadedRevisionSlot, or the full pass's raw rows. */
export interface SlotForPricing {
	category: PartCategory;
	quantity: number;
	pickPartId: number;
	priceQuote: ChosenQuote | null;
	alternates: readonly { partId: number }[];
}

/** The latest active quote per part in each region: region id → part id → quote. */
export type LatestQuotes = Map<number, Map<number, QuoteInput>>;

export interface SlotToPrice {
	category: PartCategory;
	quantity: number;
	pick: OptionToPrice;
	alternates: readonly OptionToPrice[];
}

/** Slots priced together (a revision's, a build's) and the region their base prices come from. */
export interface SlotSet {
	base: Region;
	slots: readonly SlotToPrice[];
}

/** Each slot's lines as pages show them (null where unpriced), in slot order. */
export interface SlotPrices {
	pick: PriceLine | null;
	alternates: (PriceLine | null)[];
}

export interface PricedSet {
	base: Region;
	/** The region the set is priced in: the target, or the set's base when there is none. */
	region: Region;
	/**
	 * The domain's answer: per slot the pick's and the alternates' priced lines and the pick's
	 * line total; the picks total, the unpriced count, the min–max range over alternates, how
	 * the picks were priced and the oldest rate date behind an estimate.
	 */
	adjustment: RegionAdjustment;
	prices: SlotPrices[];
}

export interface PricingRun {
	sets: PricedSet[];
	/** The rates the run priced with; empty when no set crossed regions and none were asked for. */
	rates: RatesPerEur;
	/** The latest active quote of a part in the target or a base region of the run. */
	latestQuote(partId: number, regionId: number): QuoteInput | null;
}

/**
 * Prices every set in `target` (null: each set in its own base region). `withRates` loads the
 * exchange rates even when no set needs them, for callers that convert other amounts too.
 */
export async function priceSlotSets(
	sets: readonly SlotSet[],
	target: Region | null,
	options: { withRates?: boolean } = {}
): Promise<PricingRun> {
	const regionOf = (set: SlotSet) => target ?? set.base;
	const partIds = new Set<number>();
	for (const set of sets)
		for (const slot of set.slots)
			for (const option of [slot.pick, ...slot.alternates]) partIds.add(option.partId);
	const regionIds = new Set(sets.map((s) => s.base.id));
	if (target) regionIds.add(target.id);
	const crosses = sets.some((s) => regionOf(s).id !== s.base.id);
	const [quotes, rates] = await Promise.all([
		latestQuotes([...partIds], [...regionIds]),
		// Rates matter only when prices cross a currency or tax regime.
		crosses || options.withRates ? fx.ratesForPricing() : Promise.resolve({} as RatesPerEur)
	]);
	return {
		rates,
		latestQuote: (partId, regionId) => quotes.get(regionId)?.get(partId) ?? null,
		sets: priceLoadedSets(sets, target, quotes, rates)
	};
}

/**
 * priceSlotSets on inputs already loaded: `quotes` must hold the latest active quotes of
 * every option's part in every base region and the target, `rates` the rates when a set
 * crosses regions. The full pass of stored prices (guide-prices.ts) loads them once for a
 * page of revisions and prices that page in every region with them.
 */
export function priceLoadedSets(
	sets: readonly SlotSet[],
	target: Region | null,
	quotes: LatestQuotes,
	rates: RatesPerEur
): PricedSet[] {
	const regionOf = (set: SlotSet) => target ?? set.base;
	const latestQuote = (partId: number, regionId: number) =>
		quotes.get(regionId)?.get(partId) ?? null;
	return sets.map((set) => {
		const region = regionOf(set);
		const inBase = region.id === set.base.id;
		const option = (o: OptionToPrice): OptionInput => {
			const basePrice =
				o.chosenQuote && o.chosenQuote.regionId === set.base.id
					? quoteInput(o.chosenQuote)
					: latestQuote(o.partId, set.base.id);
			return {
				partId: o.partId,
				basePrice,
				targetQuote: inBase ? basePrice : latestQuote(o.partId, region.id)
			};
		};
		const adjustment = adjustToRegion({
			base: regionPricing(set.base),
			target: regionPricing(region),
			rates,
			slots: set.slots.map((slot, i) => ({
				key: i,
				category: slot.category,
				quantity: slot.quantity,
				pick: option(slot.pick),
				alternates: slot.alternates.map(option)
			}))
		});
		return {
			base: set.base,
			region,
			adjustment,
			prices: adjustment.slots.map((s) => ({
				pick: priceLine(s.pick, region),
				alternates: s.alternates.map((line) => priceLine(line, region))
			}))
		};
	});
}

/** A revision to price and the base region of its guide. */
export interface RevisionToPrice {
	revisionId: number;
	base: Region;
}

export interface PricedRevision extends PricedSet {
	revisionId: number;
	/** The revision's slots as loaded (position order, alternates by rank), for views and fit. */
	slots: LoadedRevisionSlot[];
}

export interface RevisionPricing {
	/** By revision id; a revision without a guide or base region is left out. */
	revisions: Map<number, PricedRevision>;
	rates: RatesPerEur;
	latestQuote: PricingRun['latestQuote'];
}

/**
 * Published revisions priced in `target` (null: each in its guide's base region), in one
 * pass: one query for their base regions, one for their slots, one for the quotes, and the
 * rates when needed; the same few queries however many revisions.
 */
export async function priceRevisions(
	revisionIds: readonly number[],
	target: Region | null
): Promise<RevisionPricing> {
	if (revisionIds.length === 0) return priceRevisionsIn([], target);
	const rows = (await GuideRevision.findAll({
		where: { id: [...revisionIds] },
		attributes: ['id', 'guideId'],
		include: [
			{
				model: Guide,
				as: 'guide',
				attributes: ['id', 'baseRegionId'],
				include: [{ model: Region, as: 'baseRegion' }]
			}
		]
	})) as (GuideRevision & { guide?: (Guide & { baseRegion?: Region | null }) | null })[];
	const bases = new Map(rows.map((r) => [r.id, r.guide?.baseRegion ?? null]));
	return priceRevisionsIn(
		revisionIds.flatMap((revisionId) => {
			const base = bases.get(revisionId);
			return base ? [{ revisionId, base }] : [];
		}),
		target
	);
}

/** priceRevisions for callers that already hold each revision's base region (one query fewer). */
export async function priceRevisionsIn(
	revisions: readonly RevisionToPrice[],
	target: Region | null
): Promise<RevisionPricing> {
	const slots = await loadRevisionSlots([...new Set(revisions.map((r) => r.revisionId))]);
	const byRevision = new Map<number, LoadedRevisionSlot[]>();
	for (const slot of slots) {
		const list = byRevision.get(slot.revisionId) ?? [];
		list.push(slot);
		byRevision.set(slot.revisionId, list);
	}
	const slotsOf = (r: RevisionToPrice) => byRevision.get(r.revisionId) ?? [];
	const run = await priceSlotSets(
		revisions.map((r) => ({ base: r.base, slots: slotsOf(r).map(revisionSlotToPrice) })),
		target
	);
	const priced = new Map<number, PricedRevision>();
	revisions.forEach((r, i) => {
		const set = run.sets[i];
		if (set) priced.set(r.revisionId, { ...set, revisionId: r.revisionId, slots: slotsOf(r) });
	});
	return { revisions: priced, rates: run.rates, latestQuote: run.latestQuote };
}

/** A revision's slot as pricing takes it: the pick with the author's quote, and the alternates. */
export function revisionSlotToPrice(slot: SlotForPricing): SlotToPrice {
	return {
		category: slot.category,
		quantity: slot.quantity,
		pick: { partId: slot.pickPartId, chosenQuote: slot.priceQuote },
		alternates: slot.alternates.map((a) => ({ partId: a.partId }))
	};
}

/** A priced line as pages show it; null when unpriced. */
export function priceLine(line: PricedLine, region: Region): PriceLine | null {
	if (line.status === 'unpriced' || !line.unit) return null;
	return {
		unit: line.unit,
		status: line.status,
		storeName: line.storeName,
		observedAt: line.date,
		// Region adjust puts every line in the region's display convention (a quote with the
		// other treatment is converted and says so in its note).
		taxIncluded: region.taxMode === 'inclusive'
	};
}

/** What region adjust needs to know about a region. */
export function regionPricing(r: Region): RegionPricing {
	return {
		code: r.code,
		currency: r.currency,
		taxMode: r.taxMode,
		taxRateBp: r.taxRateBp,
		categoryFactorsBp: r.categoryFactorsBp ?? {}
	};
}

export function quoteInput(q: ChosenQuote): QuoteInput {
	return {
		unit: money(Number(q.amountMinor), q.currency),
		taxIncluded: q.taxIncluded,
		observedAt: q.observedAt.toISOString(),
		storeName: q.store.name
	};
}

/** The latest active quote per part in each region (any store): region id → part id → quote. */
async function latestQuotes(partIds: number[], regionIds: number[]): Promise<LatestQuotes> {
	const result: LatestQuotes = new Map();
	if (partIds.length === 0 || regionIds.length === 0) return result;
	const quotes = (await Quote.findAll({
		where: { partId: partIds, regionId: regionIds, status: 'active' },
		include: [{ model: Store, as: 'store' }],
		order: [
			['observedAt', 'DESC'],
			['id', 'DESC']
		]
	})) as QuoteWithStore[];
	for (const q of quotes) {
		const inRegion = result.get(q.regionId) ?? new Map<number, QuoteInput>();
		if (!inRegion.has(q.partId)) inRegion.set(q.partId, quoteInput(q));
		result.set(q.regionId, inRegion);
	}
	return result;
}
