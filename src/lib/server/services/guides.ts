/**
 * Published guides as plain objects for pages and the API. The only module that reads
 * guide models. Prices are shown in a region: the guide's base region by default, or any
 * region a reader picks, where lines are quoted (a store's price there) or estimated from
 * the base price (domain/region.ts).
 */
import { Op } from 'sequelize';
import { money, subtract } from '$lib/domain/money';
import { adjustToRegion } from '$lib/domain/region';
import type { OptionInput, PricedLine, QuoteInput, RatesPerEur, RegionPricing, SlotInput } from '$lib/domain/region';
import type { AlternateReason, PartCategory, TaxMode } from '$lib/domain/types';
import { Guide, GuideRevision, GuideSlot, Part, Quote, Region, SlotAlternate, Store, User } from '$lib/server/db';
import * as fx from './fx';
import type { GuideCard, GuideDetail, PartRef, PriceLine, PricedGuide, RegionSummary, SlotView } from './guide-views';

export type { GuideCard, GuideDetail, PricedGuide } from './guide-views';

/** Published guides, featured first, newest first, priced in their base regions. */
export async function listPublished(): Promise<GuideCard[]> {
	const guides = await Guide.findAll({
		where: { state: 'published', publishedRevisionId: { [Op.ne]: null } },
		include: guideIncludes(),
		order: [
			['featured', 'DESC'],
			['updatedAt', 'DESC']
		]
	});
	const result: GuideCard[] = [];
	for (const guide of guides) {
		const priced = await price(guide as LoadedGuide, null);
		if (priced) result.push(toCard(priced));
	}
	return result;
}

/** The published guide in its base region, or null when there is none. */
export async function getPublishedBySlug(slug: string): Promise<GuideDetail | null> {
	const guide = await findPublished(slug);
	return guide ? price(guide, null) : null;
}

export type PricedOutcome = { kind: 'ok'; guide: PricedGuide } | { kind: 'not_found' } | { kind: 'unknown_region' };

/**
 * The published guide priced in `regionCode` (its base region when null): the guide page
 * and GET /api/v1/guides/[slug]/pricing.
 */
export async function getPriced(slug: string, regionCode: string | null): Promise<PricedOutcome> {
	const guide = await findPublished(slug);
	if (!guide) return { kind: 'not_found' };
	let target: Region | null = null;
	if (regionCode) {
		target = await Region.findOne({ where: { code: regionCode } });
		if (!target) return { kind: 'unknown_region' };
	}
	const priced = await price(guide, target);
	return priced ? { kind: 'ok', guide: { ...priced, regions: await listRegions() } } : { kind: 'not_found' };
}

async function findPublished(slug: string): Promise<LoadedGuide | null> {
	return (await Guide.findOne({
		where: { slug, state: 'published', publishedRevisionId: { [Op.ne]: null } },
		include: guideIncludes()
	})) as LoadedGuide | null;
}

function guideIncludes() {
	return [
		{ model: User, as: 'author', attributes: ['name'] },
		{ model: Region, as: 'baseRegion' },
		{ model: GuideRevision, as: 'publishedRevision' }
	];
}

type LoadedGuide = Guide & { author?: User | null; baseRegion?: Region; publishedRevision?: GuideRevision | null };
type QuoteWithStore = Quote & { store: Store };
type LoadedSlot = GuideSlot & {
	pick: Part;
	priceQuote: QuoteWithStore | null;
	alternates: (SlotAlternate & { part: Part })[];
};

async function loadSlots(revisionId: number): Promise<LoadedSlot[]> {
	return (await GuideSlot.findAll({
		where: { revisionId },
		include: [
			{ model: Part, as: 'pick' },
			{ model: Quote, as: 'priceQuote', include: [{ model: Store, as: 'store' }] },
			{ model: SlotAlternate, as: 'alternates', include: [{ model: Part, as: 'part' }] }
		],
		order: [
			['position', 'ASC'],
			[{ model: SlotAlternate, as: 'alternates' }, 'rank', 'ASC']
		]
	})) as LoadedSlot[];
}

/** Prices the guide in `target` (null: its base region, using the author's chosen quotes). */
async function price(guide: LoadedGuide, target: Region | null): Promise<PricedGuide | null> {
	const base = guide.baseRegion;
	const revision = guide.publishedRevision;
	if (!base || !revision) return null;
	const region = target ?? base;
	const inBase = region.id === base.id;

	const slots = await loadSlots(revision.id);
	const allPartIds = slots.flatMap((s) => [s.pick.id, ...s.alternates.map((a) => a.part.id)]);
	const baseQuotes = await latestQuotes(allPartIds, base.id);
	const targetQuotes = inBase ? baseQuotes : await latestQuotes(allPartIds, region.id);
	// Rates matter only when prices cross a currency or tax regime.
	const rates: RatesPerEur = inBase ? {} : await fx.ratesForPricing();

	const option = (part: Part, chosen: QuoteWithStore | null): OptionInput => {
		const basePrice = chosen ? quoteInput(chosen) : (baseQuotes.get(part.id) ?? null);
		return { partId: part.id, basePrice, targetQuote: inBase ? basePrice : (targetQuotes.get(part.id) ?? null) };
	};
	const inputs: SlotInput[] = slots.map((s) => ({
		key: s.id,
		category: s.category,
		quantity: s.quantity,
		pick: option(s.pick, s.priceQuote),
		alternates: s.alternates.map((a) => option(a.part, null))
	}));
	const adjusted = adjustToRegion({ base: pricingOf(base), target: pricingOf(region), slots: inputs, rates });

	const slotViews: SlotView[] = slots.map((slot, i) => {
		const line = adjusted.slots[i];
		const pickPrice = line ? priceLine(line.pick, region) : null;
		return {
			id: slot.id,
			category: slot.category,
			label: slot.label,
			position: slot.position,
			quantity: slot.quantity,
			pick: partRef(slot.pick),
			reason: slot.reason,
			price: pickPrice,
			lineTotal: line?.lineTotal ?? null,
			alternates: slot.alternates.map((alt, j) => {
				const altPrice = line?.alternates[j] ? priceLine(line.alternates[j], region) : null;
				return {
					rank: alt.rank,
					part: partRef(alt.part),
					reasonTag: alt.reasonTag as AlternateReason,
					note: alt.note,
					price: altPrice,
					deltaFromPick: altPrice && pickPrice ? subtract(altPrice.unit, pickPrice.unit) : null
				};
			})
		};
	});

	const ratesAsOf = adjusted.oldestRateAsOf;
	return {
		slug: guide.slug,
		title: guide.title,
		summary: guide.summary,
		authorName: guide.author?.name ?? 'Former member',
		targetBudget: money(Number(guide.targetBudgetMinor), base.currency),
		baseRegion: regionSummary(base),
		tags: guide.tags,
		featured: guide.featured,
		picksTotal: adjusted.picksTotal,
		unpricedSlots: adjusted.unpricedSlots,
		publishedAt: (revision.publishedAt ?? guide.updatedAt).toISOString(),
		revisionNumber: revision.number,
		slots: slotViews,
		totalRange: adjusted.range,
		region: regionSummary(region),
		regions: [],
		picks: adjusted.picks,
		ratesAsOf,
		ratesStale: ratesAsOf !== null && fx.rateAgeDays(ratesAsOf, new Date()) > fx.STALE_AFTER_DAYS
	};
}

function toCard(detail: GuideDetail): GuideCard {
	const { slots: _slots, totalRange: _range, revisionNumber: _n, ...rest } = detail;
	const { region: _r, regions: _rs, picks: _p, ratesAsOf: _a, ratesStale: _s, ...card } = rest as PricedGuide;
	return card;
}

/** Every region, for the switcher. */
export async function listRegions(): Promise<RegionSummary[]> {
	return (await Region.findAll({ order: [['name', 'ASC']] })).map(regionSummary);
}

/** Latest active quote per part in a region (any store). */
async function latestQuotes(partIds: number[], regionId: number): Promise<Map<number, QuoteInput>> {
	const result = new Map<number, QuoteInput>();
	if (partIds.length === 0) return result;
	const quotes = (await Quote.findAll({
		where: { partId: partIds, regionId, status: 'active' },
		include: [{ model: Store, as: 'store' }],
		order: [['observedAt', 'DESC']]
	})) as QuoteWithStore[];
	for (const q of quotes) if (!result.has(q.partId)) result.set(q.partId, quoteInput(q));
	return result;
}

function quoteInput(q: QuoteWithStore): QuoteInput {
	return {
		unit: money(Number(q.amountMinor), q.currency),
		taxIncluded: q.taxIncluded,
		observedAt: q.observedAt.toISOString(),
		storeName: q.store.name
	};
}

function priceLine(line: PricedLine, region: Region): PriceLine | null {
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

function pricingOf(r: Region): RegionPricing {
	return {
		code: r.code,
		currency: r.currency,
		taxMode: r.taxMode as TaxMode,
		taxRateBp: r.taxRateBp,
		categoryFactorsBp: r.categoryFactorsBp ?? {}
	};
}

function partRef(p: Part): PartRef {
	return { id: p.id, slug: p.slug, brand: p.brand, model: p.model, category: p.category as PartCategory };
}

function regionSummary(r: Region): RegionSummary {
	return {
		code: r.code,
		name: r.name,
		currency: r.currency,
		taxMode: r.taxMode as TaxMode,
		taxRateBp: r.taxRateBp
	};
}

export interface AuthoredGuide {
	slug: string;
	title: string;
	state: string;
	updatedAt: string;
	published: boolean;
}

/** The guides an author owns, in any state, most recently changed first. */
export async function listByAuthor(authorId: string): Promise<AuthoredGuide[]> {
	const rows = await Guide.findAll({ where: { authorId }, order: [['updatedAt', 'DESC']] });
	return rows.map((g) => ({
		slug: g.slug,
		title: g.title,
		state: g.state,
		updatedAt: g.updatedAt.toISOString(),
		published: g.state === 'published' && g.publishedRevisionId !== null
	}));
}
