/**
 * Published guides as plain objects for pages and the API. The only module that reads
 * guide models; every price here is in the guide's base region, as quoted.
 */
import { Op } from 'sequelize';
import { money, subtract } from '$lib/domain/money';
import { listTotals } from '$lib/domain/totals';
import type { AlternateReason, PartCategory, TaxMode } from '$lib/domain/types';
import { Guide, GuideRevision, GuideSlot, Part, Quote, Region, SlotAlternate, Store, User } from '$lib/server/db';
import type { GuideCard, GuideDetail, PartRef, PriceLine, RegionSummary, SlotView } from './guide-views';

export type { GuideCard, GuideDetail } from './guide-views';

/** Published guides, featured first, newest first. */
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
		const detail = await toDetail(guide);
		if (detail) result.push(toCard(detail));
	}
	return result;
}

/** The published guide with its current revision's slots, or null when there is none. */
export async function getPublishedBySlug(slug: string): Promise<GuideDetail | null> {
	const guide = await Guide.findOne({
		where: { slug, state: 'published', publishedRevisionId: { [Op.ne]: null } },
		include: guideIncludes()
	});
	return guide ? toDetail(guide) : null;
}

function guideIncludes() {
	return [
		{ model: User, as: 'author', attributes: ['name'] },
		{ model: Region, as: 'baseRegion' },
		{ model: GuideRevision, as: 'publishedRevision' }
	];
}

type LoadedGuide = Guide & { author?: User | null; baseRegion?: Region; publishedRevision?: GuideRevision | null };
type LoadedSlot = GuideSlot & {
	pick: Part;
	priceQuote: (Quote & { store: Store }) | null;
	alternates: (SlotAlternate & { part: Part })[];
};

async function toDetail(raw: Guide): Promise<GuideDetail | null> {
	const guide = raw as LoadedGuide;
	const region = guide.baseRegion;
	const revision = guide.publishedRevision;
	if (!region || !revision) return null;

	const slots = (await GuideSlot.findAll({
		where: { revisionId: revision.id },
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

	const alternatePartIds = slots.flatMap((s) => s.alternates.map((a) => a.part.id));
	const latest = await latestQuotes(alternatePartIds, region.id);

	const slotViews: SlotView[] = slots.map((slot) => {
		const price = slot.priceQuote ? priceLine(slot.priceQuote, slot.priceQuote.store) : null;
		return {
			id: slot.id,
			category: slot.category,
			label: slot.label,
			position: slot.position,
			quantity: slot.quantity,
			pick: partRef(slot.pick),
			reason: slot.reason,
			price,
			lineTotal: price ? money(price.unit.amountMinor * slot.quantity, price.unit.currency) : null,
			alternates: slot.alternates.map((alt) => {
				const altPrice = latest.get(alt.part.id) ?? null;
				return {
					rank: alt.rank,
					part: partRef(alt.part),
					reasonTag: alt.reasonTag as AlternateReason,
					note: alt.note,
					price: altPrice,
					deltaFromPick: altPrice && price ? subtract(altPrice.unit, price.unit) : null
				};
			})
		};
	});

	const totals = listTotals(
		slotViews.map((s) => ({
			quantity: s.quantity,
			pick: s.price?.unit ?? null,
			alternates: s.alternates.map((a) => a.price?.unit ?? null)
		})),
		region.currency
	);

	return {
		slug: guide.slug,
		title: guide.title,
		summary: guide.summary,
		authorName: guide.author?.name ?? 'Former member',
		targetBudget: money(Number(guide.targetBudgetMinor), region.currency),
		baseRegion: regionSummary(region),
		tags: guide.tags,
		featured: guide.featured,
		picksTotal: totals.picksTotal,
		unpricedSlots: totals.unpricedSlots,
		publishedAt: (revision.publishedAt ?? guide.updatedAt).toISOString(),
		revisionNumber: revision.number,
		slots: slotViews,
		totalRange: totals.range
	};
}

function toCard(detail: GuideDetail): GuideCard {
	const { slots: _slots, totalRange: _range, revisionNumber: _n, ...card } = detail;
	return card;
}

/** Latest active quote per part in a region (any store), as price lines. */
async function latestQuotes(partIds: number[], regionId: number): Promise<Map<number, PriceLine>> {
	const result = new Map<number, PriceLine>();
	if (partIds.length === 0) return result;
	const quotes = (await Quote.findAll({
		where: { partId: partIds, regionId, status: 'active' },
		include: [{ model: Store, as: 'store' }],
		order: [['observedAt', 'DESC']]
	})) as (Quote & { store: Store })[];
	for (const q of quotes) {
		if (!result.has(q.partId)) result.set(q.partId, priceLine(q, q.store));
	}
	return result;
}

function priceLine(q: Quote, store: Store): PriceLine {
	return {
		unit: money(Number(q.amountMinor), q.currency),
		storeName: store.name,
		observedAt: q.observedAt.toISOString().slice(0, 10),
		taxIncluded: q.taxIncluded
	};
}

function partRef(p: Part): PartRef {
	return { slug: p.slug, brand: p.brand, model: p.model, category: p.category as PartCategory };
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
