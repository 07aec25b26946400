/**
 * A build as its page, its printable list, its CSV and GET /api/v1/builds/[id] show it
 * (docs/architecture.md "Build", "Drift"): priced in its region (or another the reader picks)
 * through build-pricing.ts, with each slot's options from the source and whether they fit,
 * the fit report, power budget, purchase totals, drift against the base revision and value
 * against the source.
 *
 * Who sees what is build-access.ts's decision; here the owner's private data (share token,
 * budget, notes, purchases) is blanked for everyone else.
 */
import { dropIns } from '$lib/domain/dropins';
import { summarize } from '$lib/domain/fit';
import { money, multiply, sum } from '$lib/domain/money';
import { powerBudget } from '$lib/domain/power';
import { convertThroughEur, MissingRateError } from '$lib/domain/region';
import type { PricedLine, RatesPerEur } from '$lib/domain/region';
import { drift as driftOf } from '$lib/domain/sync';
import type { BuildSlot as SyncBuildSlot, SourceSlot } from '$lib/domain/sync';
import type { Money, PartCategory } from '$lib/domain/types';
import { valueOf } from '$lib/domain/value';
import { FrameResult, Region } from '$lib/server/db';
import type {
	BuildSlotView,
	BuildSourceView,
	BuildView,
	BuildVisibility,
	DriftView,
	ValueView
} from '$lib/views';
import { buildAccess } from './build-access';
import type { Viewer } from './build-access';
import { loadBuild, loadSlots, priceBuild } from './build-pricing';
import type { BuildPricing, LoadedBuild, LoadedSlot } from './build-pricing';
import { sourceSlotsOf } from './build-source';
import { activeRules } from './caution-rules';
import { dropInSlot, partName, partRef, picksOf, regionSummary } from './mappers';

/**
 * The build priced in its region (or in `opts.regionCode` when that region exists). Null
 * when the viewer may not see it: the caller answers 404 with no data, whether the build
 * exists or not.
 */
export async function getBuild(
	viewer: Viewer,
	id: number,
	opts: { shareToken?: string; regionCode?: string } = {}
): Promise<BuildView | null> {
	const build = await loadBuild(id);
	if (!build) return null;
	const who = await buildAccess(build, viewer, opts.shareToken);
	if (!who) return null;
	let region = build.region;
	if (opts.regionCode && opts.regionCode !== region.code) {
		region = (await Region.findOne({ where: { code: opts.regionCode } })) ?? region;
	}
	return assemble(build, region, who === 'owner');
}

async function assemble(build: LoadedBuild, region: Region, isOwner: boolean): Promise<BuildView> {
	const slots = await loadSlots(build.id);
	// Rates beyond pricing's own needs only to convert what the owner paid in another currency.
	const paidElsewhere = slots.some(
		(s) => s.purchased && s.paidCurrency !== null && s.paidCurrency !== region.currency
	);
	const [pricing, frames, cautionRules] = await Promise.all([
		priceBuild(build, region, slots, { withRates: isOwner && paidElsewhere }),
		build.baseRevisionId
			? FrameResult.findAll({
					where: { revisionId: build.baseRevisionId },
					attributes: ['avgFpsTenths']
				})
			: Promise.resolve([]),
		activeRules()
	]);
	const currency = region.currency;
	let ratesAsOf: string | null = null;
	const noteRate = (line: PricedLine) => {
		if (line.status === 'estimated' && line.date && (ratesAsOf === null || line.date < ratesAsOf))
			ratesAsOf = line.date;
	};

	// Fit: the build's parts, each slot's options as drop-ins (one report per option).
	const dropSlots = pricing.slots.map(({ slot, options }) =>
		dropInSlot(
			String(slot.id),
			slot,
			slot.part,
			options.map((o, j) => ({ id: `${slot.id}:${j}`, part: o.part }))
		)
	);
	const drop = dropIns(dropSlots, cautionRules);
	const fitsById = new Map(drop.alternates.map((r) => [String(r.alternateId), r.fits]));

	const slotViews: BuildSlotView[] = pricing.slots.map(({ slot, line, price, options }) => {
		if (price?.status !== 'override') noteRate(line);
		for (const o of options) noteRate(o.line);
		return {
			...slotView(slot, isOwner, currency),
			price,
			lineTotal: price ? multiply(price.unit, slot.quantity) : null,
			options: options.map((o, j) => ({
				part: partRef(o.part),
				kind: o.kind,
				rank: o.rank,
				reasonTag: o.reasonTag,
				note: o.note,
				price: o.price,
				fits: fitsById.get(`${slot.id}:${j}`) ?? false
			}))
		};
	});

	// Totals (see BuildTotals): exact sums in the region's currency.
	const priced = slotViews.filter((s) => s.lineTotal !== null);
	const planned = sum(
		priced.map((s) => s.lineTotal as Money),
		currency
	);
	const bought = slotViews.filter((s) => s.purchase.purchased);
	const spent = sum(
		bought
			.map((s) => paidInRegion(s, currency, pricing.rates))
			.filter((m): m is Money => m !== null),
		currency
	);
	const remainingToBuy = sum(
		priced.filter((s) => !s.purchase.purchased).map((s) => s.lineTotal as Money),
		currency
	);
	const budget =
		isOwner && build.budgetMinor !== null ? money(Number(build.budgetMinor), currency) : null;
	const leftOfBudget = budget
		? money(budget.amountMinor - spent.amountMinor - remainingToBuy.amountMinor, currency)
		: null;
	const unpricedSlots = slotViews.length - priced.length;

	const sourceSlots = sourceSlotsOf(pricing.source.slots);
	const localSlots: SyncBuildSlot[] = slots.map((s) => ({
		id: s.id,
		sourceKey: s.sourceSlotKey,
		label: s.label,
		category: s.category,
		partId: s.partId,
		quantity: s.quantity
	}));
	let value: BuildView['value'] = { build: null, source: null, sourceResultsDiffer: false };
	if (build.baseRevisionId) {
		for (const s of pricing.sourcePicks.slots) noteRate(s.pick);
		const buildTotal = unpricedSlots === 0 && slotViews.length > 0 ? planned : null;
		value = valueAgainstSource(
			frames.map((f) => ({ averageFps: f.avgFpsTenths / 10 })),
			buildTotal,
			pricing,
			{ local: localSlots, source: sourceSlots }
		);
	}

	return {
		id: build.id,
		title: build.title,
		ownerName: build.owner?.name ?? 'Former member',
		isOwner,
		visibility: build.visibility as BuildVisibility,
		shareToken: isOwner ? build.shareToken : null,
		notes: isOwner ? build.notes : '',
		version: build.version,
		notifyOnNewRevision: isOwner ? build.notifyOnNewRevision : false,
		region: regionSummary(region),
		budget,
		source: sourceView(build),
		slots: slotViews,
		totals: {
			planned,
			spent,
			remainingToBuy,
			leftOfBudget,
			unpricedSlots,
			boughtCount: bought.length
		},
		fit: {
			findings: drop.picks,
			summary: summarize(drop.picks),
			slotLabels: Object.fromEntries(slots.map((s) => [String(s.id), s.label]))
		},
		power: powerBudget(picksOf(dropSlots)),
		drift: driftViews(sourceSlots, localSlots, slots, pricing),
		value,
		ratesAsOf,
		updatedAt: build.updatedAt.toISOString(),
		// Only the owner and editors get a hidden build at all (see build-access.ts).
		hidden: build.hiddenAt
			? { reason: build.hiddenReason ?? '', hiddenAt: build.hiddenAt.toISOString() }
			: null
	};
}

/** A slot's own fields: part, origin, the reader's override and (owner only) purchase. */
function slotView(
	slot: LoadedSlot,
	isOwner: boolean,
	currency: string
): Omit<BuildSlotView, 'price' | 'lineTotal' | 'options'> {
	const overrideSet = slot.priceOverrideMinor !== null && slot.priceOverrideCurrency !== null;
	return {
		id: slot.id,
		sourceSlotKey: slot.sourceSlotKey,
		category: slot.category,
		label: slot.label,
		position: slot.position,
		quantity: slot.quantity,
		origin: slot.origin,
		part: partRef(slot.part),
		override: overrideSet
			? {
					amount: money(Number(slot.priceOverrideMinor), slot.priceOverrideCurrency as string),
					store: slot.priceOverrideStore ?? '',
					date: slot.priceOverrideDate ?? '',
					applied: slot.priceOverrideCurrency === currency
				}
			: null,
		purchase:
			isOwner && slot.purchased
				? {
						purchased: true,
						paid:
							slot.paidMinor !== null && slot.paidCurrency
								? money(Number(slot.paidMinor), slot.paidCurrency)
								: null,
						purchasedAt: slot.purchasedAt,
						store: slot.purchaseStore
					}
				: { purchased: false, paid: null, purchasedAt: null, store: null }
	};
}

/** Drift against the base revision (domain/sync.ts drift), with parts named. */
function driftViews(
	sourceSlots: SourceSlot[],
	localSlots: SyncBuildSlot[],
	slots: readonly LoadedSlot[],
	pricing: BuildPricing
): DriftView[] {
	const partNames = new Map<number, string>();
	for (const s of slots) partNames.set(s.partId, partName(s.part));
	for (const { slot } of pricing.source.slots) partNames.set(slot.pickPartId, partName(slot.pick));
	return driftOf(sourceSlots, localSlots).rows.map((r) => {
		const label = r.local?.label ?? r.base?.label ?? '';
		const key = r.local ? `build:${String(r.local.id)}` : `source:${r.sourceKey ?? ''}`;
		// Each kind carries the sides it is about (drift in domain/sync.ts); a side left
		// out reads as an empty name rather than throwing.
		const named = (s: { partId: number; quantity: number } | null) =>
			s
				? `${partNames.get(s.partId) ?? `part ${s.partId}`}${s.quantity > 1 ? ` × ${s.quantity}` : ''}`
				: '';
		switch (r.kind) {
			case 'swapped':
				return { key, label, kind: r.kind, from: named(r.base), to: named(r.local) };
			case 'quantity':
				return {
					key,
					label,
					kind: r.kind,
					from: String(r.base?.quantity ?? ''),
					to: String(r.local?.quantity ?? '')
				};
			case 'added':
				return { key, label, kind: r.kind, to: named(r.local) };
			case 'removed':
				return { key, label, kind: r.kind, from: named(r.base) };
			default:
				return { key, label, kind: r.kind };
		}
	});
}

/** Value of the build and of its source in the region, against the source's frame results. */
function valueAgainstSource(
	results: { averageFps: number }[],
	buildTotal: Money | null,
	pricing: BuildPricing,
	slots: { local: SyncBuildSlot[]; source: SourceSlot[] }
): BuildView['value'] {
	const picks = pricing.sourcePicks;
	const sourceTotal = picks.slots.length > 0 && picks.unpricedSlots === 0 ? picks.picksTotal : null;
	const idsOf = (parts: { category: string; partId: number }[], category: PartCategory) =>
		parts
			.filter((p) => p.category === category)
			.map((p) => p.partId)
			.sort((a, b) => a - b)
			.join(',');
	return {
		build: { ...valueOf(results, buildTotal), total: buildTotal } satisfies ValueView,
		source: { ...valueOf(results, sourceTotal), total: sourceTotal } satisfies ValueView,
		// The results were measured with the source's CPU and graphics card.
		sourceResultsDiffer: (['cpu', 'gpu'] as const).some(
			(c) => idsOf(slots.local, c) !== idsOf(slots.source, c)
		)
	};
}

/**
 * A bought slot's spend in the region's currency: what was paid (converted through EUR at
 * the stored ECB rates if it was paid before a change of region), else the line total.
 * Null when neither is known (an unpriced slot bought without an amount).
 */
function paidInRegion(slot: BuildSlotView, currency: string, rates: RatesPerEur): Money | null {
	const paid = slot.purchase.paid;
	if (!paid) return slot.lineTotal;
	if (paid.currency === currency) return paid;
	try {
		return convertThroughEur(paid, currency, rates);
	} catch (e) {
		if (e instanceof MissingRateError) return slot.lineTotal;
		throw e;
	}
}

/**
 * Where the build came from, and whether a newer revision of it is published; null when there
 * is none to show: a guide an editor has hidden is a 404 for readers, so a build (public ones
 * included) names and links it no more than any other page does (issue 12, item 9).
 */
export function sourceView(build: LoadedBuild): BuildSourceView | null {
	const guide = build.sourceGuide;
	if (!guide || guide.hiddenAt) return null;
	const published =
		guide.state === 'published' && !guide.hiddenAt ? (guide.publishedRevision ?? null) : null;
	const baseNumber = build.baseRevision?.number ?? null;
	const latest = published?.number ?? null;
	return {
		slug: guide.slug,
		title: guide.title,
		authorName: guide.author?.name ?? 'Former member',
		baseRevisionNumber: baseNumber,
		latestRevisionNumber: latest,
		newerRevisionAvailable: latest !== null && (baseNumber === null || latest > baseNumber)
	};
}
