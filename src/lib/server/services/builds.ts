/**
 * Builds (docs/architecture.md "Build", "Drift"; issue 7): a reader's fork of a published guide
 * revision, priced in the reader's region, with the base revision's pick and alternates
 * offered per slot, a purchase tracker, drift against the base and value against the
 * source. Edits of a build live here; the two bulk changes live beside it and follow the
 * same version rule: build-sync (take a newer revision, undo it) and build-budget (apply
 * the within-budget swaps), both reading through `pricedOptions` and `getBuild`.
 *
 * Who sees what: private builds are their owner's alone; unlisted ones open for anyone
 * with their link token; public ones open for anyone and are listed in the guide's
 * lineage. Only the owner sees the share token, the budget, the notes and the purchase
 * tracker (what was paid, when, where): those are the owner's private data.
 *
 * Every change is the owner's only, one transaction, guarded by builds.version
 * (UPDATE … WHERE id AND owner AND version = expected): a stale version changes nothing
 * and answers with the build as it is now.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { stringify } from 'csv-stringify/sync';
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { BuildPart, PartInfo } from '$lib/domain/build-parts';
import { dropIns } from '$lib/domain/dropins';
import type { GuideSlot as DropInSlot } from '$lib/domain/dropins';
import { summarize } from '$lib/domain/fit';
import { minorUnitDigits, money, multiply, sum } from '$lib/domain/money';
import { powerBudget } from '$lib/domain/power';
import { convertThroughEur, MissingRateError, priceOption } from '$lib/domain/region';
import type {
	OptionInput,
	PricedLine,
	QuoteInput,
	RatesPerEur,
	RegionPricing
} from '$lib/domain/region';
import { drift as driftOf, slotKeys } from '$lib/domain/sync';
import type { BuildSlot as SyncBuildSlot, SourceSlot } from '$lib/domain/sync';
import type { Money, PartCategory, TaxMode } from '$lib/domain/types';
import { valueOf } from '$lib/domain/value';
import {
	Build,
	BuildSlot,
	FrameResult,
	Guide,
	GuideRevision,
	Part,
	Quote,
	Region,
	Store,
	User,
	sequelize
} from '$lib/server/db';
import { neutraliseCell } from '$lib/server/csv-cells';
import { activeRules } from './caution-rules';
import { hasOpenReport } from './content-reports';
import * as fx from './fx';
import { toMinor } from './guide-drafts';
import { loadRevisionSlots } from './revision-snapshots';
import type { LoadedRevisionSlot, QuoteWithStore } from './revision-snapshots';
import type {
	BuildCard,
	BuildOptionView,
	BuildPriceLine,
	BuildSlotOrigin,
	BuildSlotView,
	BuildSourceView,
	BuildView,
	BuildVisibility,
	DriftView,
	LineageView,
	PartRef,
	PriceLine,
	PricedOption,
	PricedSlotOptions,
	RegionSummary,
	ValueView
} from './build-views';

export type {
	BuildCard,
	BuildOptionView,
	BuildPriceLine,
	BuildSlotView,
	BuildSourceView,
	BuildTotals,
	BuildView,
	DriftView,
	LineageView,
	PricedOption,
	PricedSlotOptions,
	ValueView
} from './build-views';

/** `role` (the session's) lets editors and admins open a hidden or reported build (see `editorAccess`). */
export type Viewer = { id: string; role?: string } | null;
type Issues = Record<string, string[]>;

export type MutationOutcome =
	| { kind: 'ok'; build: BuildView }
	| { kind: 'conflict'; current: BuildView }
	| { kind: 'invalid'; issues: Issues }
	| { kind: 'not_found' };

/** Most slots a build may have (a guide has a dozen; this leaves room for extras). */
export const MAX_BUILD_SLOTS = 40;

// ---------------------------------------------------------------------------------------------
// Slot keys
// ---------------------------------------------------------------------------------------------

/** A revision slot with its key (see `keyedRevisionSlots`). */
export type KeyedRevisionSlot = { key: string; slot: LoadedRevisionSlot };

/**
 * The key of each slot of one revision: its label, which stays the same from one revision to
 * the next (domain/sync.ts). Labels are not forced unique by the guide editor, so a repeated
 * label gets " (2)", " (3)"… in order of position; keys fit the 80-character column.
 * Fork, drift, sync and within-budget all key revision slots with this function.
 */
export function keyedRevisionSlots(slots: readonly LoadedRevisionSlot[]): KeyedRevisionSlot[] {
	const keys = slotKeys(slots.map((s) => s.label));
	return slots.map((slot, i) => ({ key: keys[i] ?? slot.label, slot }));
}

/** A revision's slots as domain/sync.ts takes them. */
export function sourceSlotsOf(keyed: readonly KeyedRevisionSlot[]): SourceSlot[] {
	return keyed.map(({ key, slot }) => ({
		key,
		label: slot.label,
		category: slot.category,
		partId: slot.pickPartId,
		quantity: slot.quantity
	}));
}

// ---------------------------------------------------------------------------------------------
// Fork
// ---------------------------------------------------------------------------------------------

/** 32 random bytes, base64url: 43 characters, the unguessable part of an unlisted build's link. */
export function newShareToken(): string {
	return randomBytes(32).toString('base64url');
}

/**
 * Copies the guide's published revision into a new private build owned by `ownerId`, in
 * the guide's base region, in one transaction (the build row and every slot, or nothing).
 * Hidden, unpublished or unknown guides: not_found.
 */
export async function fork(
	ownerId: string,
	guideSlug: string
): Promise<{ kind: 'created'; id: number } | { kind: 'not_found' }> {
	const guide = await Guide.findOne({
		where: {
			slug: guideSlug,
			state: 'published',
			publishedRevisionId: { [Op.ne]: null },
			hiddenAt: null
		}
	});
	if (!guide || guide.publishedRevisionId === null) return { kind: 'not_found' };
	const revisionId = guide.publishedRevisionId;
	const slots = keyedRevisionSlots(await loadRevisionSlots([revisionId]));
	const suffix = ' (my build)';
	const id = await sequelize.transaction(async (transaction) => {
		const build = await Build.create(
			{
				ownerId,
				sourceGuideId: guide.id,
				baseRevisionId: revisionId,
				title: `${guide.title.slice(0, 160 - suffix.length)}${suffix}`,
				regionId: guide.baseRegionId,
				visibility: 'private',
				shareToken: newShareToken(),
				notes: ''
			},
			{ transaction }
		);
		await BuildSlot.bulkCreate(
			slots.map(({ key, slot }, i) => ({
				buildId: build.id,
				sourceSlotKey: key,
				category: slot.category,
				label: slot.label,
				position: i + 1,
				partId: slot.pickPartId,
				quantity: slot.quantity,
				origin: 'source' as const
			})),
			{ transaction }
		);
		return build.id;
	});
	return { kind: 'created', id };
}

// ---------------------------------------------------------------------------------------------
// Loading and visibility
// ---------------------------------------------------------------------------------------------

type LoadedGuide = Guide & {
	author?: User | null;
	baseRegion?: Region;
	publishedRevision?: GuideRevision | null;
};
type LoadedBuild = Build & {
	owner?: User | null;
	region: Region;
	sourceGuide?: LoadedGuide | null;
	baseRevision?: GuideRevision | null;
};
type LoadedSlot = BuildSlot & { part: Part };

async function loadBuild(id: number, transaction?: Transaction): Promise<LoadedBuild | null> {
	return (await Build.findByPk(id, {
		include: [
			{ model: User, as: 'owner', attributes: ['id', 'name'] },
			{ model: Region, as: 'region' },
			{
				model: Guide,
				as: 'sourceGuide',
				include: [
					{ model: User, as: 'author', attributes: ['name'] },
					{ model: Region, as: 'baseRegion' },
					{ model: GuideRevision, as: 'publishedRevision' }
				]
			},
			{ model: GuideRevision, as: 'baseRevision' }
		],
		transaction
	})) as LoadedBuild | null;
}

async function loadSlots(buildId: number, transaction?: Transaction): Promise<LoadedSlot[]> {
	return (await BuildSlot.findAll({
		where: { buildId },
		include: [{ model: Part, as: 'part' }],
		order: [
			['position', 'ASC'],
			['id', 'ASC']
		],
		transaction
	})) as LoadedSlot[];
}

function tokenMatches(stored: string, given: string | undefined): boolean {
	if (!given) return false;
	const a = Buffer.from(stored);
	const b = Buffer.from(given);
	return a.length === b.length && timingSafeEqual(a, b);
}

/** 'owner', 'other' (may read, sees no private data) or null (may not know the build exists). */
function access(
	build: Build,
	viewer: Viewer,
	shareToken: string | undefined
): 'owner' | 'other' | null {
	if (viewer && viewer.id === build.ownerId) return 'owner';
	// Hidden by the editors (services/content-reports): a 404 for everyone but the owner and editors.
	if (build.hiddenAt) return null;
	if (build.visibility === 'public') return 'other';
	if (build.visibility === 'unlisted' && tokenMatches(build.shareToken, shareToken)) return 'other';
	return null;
}

/**
 * Editors and admins open a build that is hidden or has an open content report, whatever its
 * visibility (it may have been made private after the report), to decide on it. They read it
 * as anyone else does: no share token, notes, budget or purchases.
 */
async function editorAccess(build: Build, viewer: Viewer): Promise<'other' | null> {
	if (!viewer || (viewer.role !== 'editor' && viewer.role !== 'admin')) return null;
	if (build.hiddenAt) return 'other';
	return (await hasOpenReport('build', String(build.id))) ? 'other' : null;
}

// ---------------------------------------------------------------------------------------------
// Pricing
// ---------------------------------------------------------------------------------------------

interface PricingContext {
	region: Region;
	/** The region estimates start from: the source guide's base region (the build's region without one). */
	base: Region;
	rates: RatesPerEur;
	/** Base revision slots with their keys; empty without a base revision. */
	baseSlots: KeyedRevisionSlot[];
	baseByKey: Map<string, LoadedRevisionSlot>;
	optionInput: (part: Part, chosen: QuoteWithStore | null) => OptionInput;
	priceOf: (part: Part, category: PartCategory, chosen: QuoteWithStore | null) => PricedLine;
}

async function pricingContext(
	build: LoadedBuild,
	region: Region,
	slots: LoadedSlot[]
): Promise<PricingContext> {
	const base = build.sourceGuide?.baseRegion ?? region;
	const inBase = base.id === region.id;
	const baseSlots = build.baseRevisionId
		? keyedRevisionSlots(await loadRevisionSlots([build.baseRevisionId]))
		: [];
	const baseByKey = new Map(baseSlots.map((k) => [k.key, k.slot]));
	const partIds = [
		...new Set([
			...slots.map((s) => s.partId),
			...baseSlots.flatMap(({ slot }) => [slot.pickPartId, ...slot.alternates.map((a) => a.partId)])
		])
	];
	const [baseQuotes, rates] = await Promise.all([
		latestQuotes(partIds, base.id),
		fx.ratesForPricing()
	]);
	const targetQuotes = inBase ? baseQuotes : await latestQuotes(partIds, region.id);
	const optionInput = (part: Part, chosen: QuoteWithStore | null): OptionInput => {
		const basePrice =
			chosen && chosen.regionId === base.id
				? quoteInput(chosen)
				: (baseQuotes.get(part.id) ?? null);
		return {
			partId: part.id,
			basePrice,
			targetQuote: inBase ? basePrice : (targetQuotes.get(part.id) ?? null)
		};
	};
	const basePricing = pricingOf(base);
	const targetPricing = pricingOf(region);
	return {
		region,
		base,
		rates,
		baseSlots,
		baseByKey,
		optionInput,
		priceOf: (part, category, chosen) =>
			priceOption(optionInput(part, chosen), category, basePricing, targetPricing, rates)
	};
}

/**
 * The author's chosen quote is the base price of the source pick (as on the guide page), so
 * a fresh fork costs what the guide shows in every region; other parts use the latest quote.
 */
function chosenQuote(
	ctx: PricingContext,
	sourceSlotKey: string | null,
	partId: number
): QuoteWithStore | null {
	const baseSlot = sourceSlotKey === null ? undefined : ctx.baseByKey.get(sourceSlotKey);
	return baseSlot && baseSlot.pickPartId === partId ? baseSlot.priceQuote : null;
}

function currentPrice(
	ctx: PricingContext,
	slot: LoadedSlot
): { line: PricedLine; price: BuildPriceLine | null } {
	const line = ctx.priceOf(
		slot.part,
		slot.category,
		chosenQuote(ctx, slot.sourceSlotKey, slot.partId)
	);
	if (slot.priceOverrideMinor !== null && slot.priceOverrideCurrency === ctx.region.currency) {
		return {
			line,
			price: {
				unit: money(Number(slot.priceOverrideMinor), ctx.region.currency),
				status: 'override',
				storeName: slot.priceOverrideStore,
				observedAt: slot.priceOverrideDate,
				taxIncluded: ctx.region.taxMode === 'inclusive'
			}
		};
	}
	return { line, price: priceLine(line, ctx.region) };
}

interface OptionSource {
	part: Part;
	kind: 'source_pick' | 'alternate';
	rank: number;
	reasonTag: string | null;
	note: string;
	chosen: QuoteWithStore | null;
}

/** The base revision's pick (unless current) and its alternates (except the current part). */
function optionsFor(ctx: PricingContext, slot: LoadedSlot): OptionSource[] {
	const baseSlot = slot.sourceSlotKey === null ? undefined : ctx.baseByKey.get(slot.sourceSlotKey);
	if (!baseSlot) return [];
	const out: OptionSource[] = [];
	if (baseSlot.pickPartId !== slot.partId) {
		out.push({
			part: baseSlot.pick,
			kind: 'source_pick',
			rank: 0,
			reasonTag: null,
			note: baseSlot.reason,
			chosen: baseSlot.priceQuote
		});
	}
	for (const alt of baseSlot.alternates) {
		if (alt.partId === slot.partId) continue;
		out.push({
			part: alt.part,
			kind: 'alternate',
			rank: alt.rank,
			reasonTag: alt.reasonTag,
			note: alt.note,
			chosen: null
		});
	}
	return out;
}

/** What the origin of a slot holding `partId` is, by the base revision's slot with its key. */
function originOf(
	ctx: PricingContext,
	sourceSlotKey: string | null,
	partId: number
): BuildSlotOrigin {
	const baseSlot = sourceSlotKey === null ? undefined : ctx.baseByKey.get(sourceSlotKey);
	if (!baseSlot) return 'custom';
	if (baseSlot.pickPartId === partId) return 'source';
	return baseSlot.alternates.some((a) => a.partId === partId) ? 'alternate' : 'custom';
}

/**
 * Loads the build's slots and prices the current part and every option of each slot in
 * `region` (quoted, else estimated from the source guide's base region; the current part's
 * override wins when it is in the region's currency). Used by build-budget.
 */
export async function pricedOptions(build: Build, region: Region): Promise<PricedSlotOptions[]> {
	const loaded = (await loadBuild(build.id)) as LoadedBuild | null;
	if (!loaded) return [];
	const slots = await loadSlots(build.id);
	const ctx = await pricingContext(loaded, region, slots);
	return slots.map((slot) => {
		const { price } = currentPrice(ctx, slot);
		const priced = (
			part: Part,
			kind: PricedOption['kind'],
			rank: number,
			p: BuildPriceLine | null
		): PricedOption => ({
			part: partRef(part),
			info: partInfo(part),
			kind,
			rank,
			price: p,
			lineTotal: p ? multiply(p.unit, slot.quantity) : null
		});
		return {
			slotId: slot.id,
			key: String(slot.id),
			sourceSlotKey: slot.sourceSlotKey,
			label: slot.label,
			category: slot.category,
			quantity: slot.quantity,
			current: priced(slot.part, 'current', 0, price),
			options: optionsFor(ctx, slot).map((o) =>
				priced(
					o.part,
					o.kind,
					o.rank,
					priceLine(ctx.priceOf(o.part, slot.category, o.chosen), region)
				)
			)
		};
	});
}

// ---------------------------------------------------------------------------------------------
// The build view
// ---------------------------------------------------------------------------------------------

/**
 * The build as its page and GET /api/v1/builds/[id] show it, priced in its region (or in
 * `opts.regionCode` when that region exists). Null when the viewer may not see it: the
 * caller answers 404 with no data, whether the build exists or not.
 */
export async function getBuild(
	viewer: Viewer,
	id: number,
	opts: { shareToken?: string; regionCode?: string } = {}
): Promise<BuildView | null> {
	const build = await loadBuild(id);
	if (!build) return null;
	const who = access(build, viewer, opts.shareToken) ?? (await editorAccess(build, viewer));
	if (!who) return null;
	let region = build.region;
	if (opts.regionCode && opts.regionCode !== region.code) {
		region = (await Region.findOne({ where: { code: opts.regionCode } })) ?? region;
	}
	return assemble(build, region, who === 'owner');
}

async function assemble(build: LoadedBuild, region: Region, isOwner: boolean): Promise<BuildView> {
	const slots = await loadSlots(build.id);
	const ctx = await pricingContext(build, region, slots);
	const [frames, cautionRules] = await Promise.all([
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
	const optionSources = slots.map((slot) => optionsFor(ctx, slot));
	const dropSlots = slots.map(
		(slot, i) =>
			({
				key: String(slot.id),
				label: slot.label,
				category: slot.category,
				quantity: slot.quantity,
				pick: partInfo(slot.part),
				alternates: (optionSources[i] ?? []).map((o, j) => ({
					id: `${slot.id}:${j}`,
					part: partInfo(o.part)
				}))
			}) as unknown as DropInSlot
	);
	const drop = dropIns(dropSlots, cautionRules);
	const fitsById = new Map(drop.alternates.map((r) => [String(r.alternateId), r.fits]));
	const buildParts = dropSlots.map(
		(d) =>
			({
				key: d.key,
				label: d.label,
				category: d.category,
				quantity: d.quantity,
				part: d.pick
			}) as unknown as BuildPart
	);

	const slotViews: BuildSlotView[] = slots.map((slot, i) => {
		const { line, price } = currentPrice(ctx, slot);
		if (price?.status !== 'override') noteRate(line);
		const overrideSet = slot.priceOverrideMinor !== null && slot.priceOverrideCurrency !== null;
		const options: BuildOptionView[] = (optionSources[i] ?? []).map((o, j) => {
			const optionLine = ctx.priceOf(o.part, slot.category, o.chosen);
			noteRate(optionLine);
			return {
				part: partRef(o.part),
				kind: o.kind,
				rank: o.rank,
				reasonTag: o.reasonTag,
				note: o.note,
				price: priceLine(optionLine, region),
				fits: fitsById.get(`${slot.id}:${j}`) ?? false
			};
		});
		return {
			id: slot.id,
			sourceSlotKey: slot.sourceSlotKey,
			category: slot.category,
			label: slot.label,
			position: slot.position,
			quantity: slot.quantity,
			origin: slot.origin,
			part: partRef(slot.part),
			price,
			lineTotal: price ? multiply(price.unit, slot.quantity) : null,
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
					: { purchased: false, paid: null, purchasedAt: null, store: null },
			options
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
		bought.map((s) => paidInRegion(s, currency, ctx.rates)).filter((m): m is Money => m !== null),
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

	// Drift against the base revision, and value against the source.
	const sourceSlots = sourceSlotsOf(ctx.baseSlots);
	const localSlots: SyncBuildSlot[] = slots.map((s) => ({
		id: s.id,
		sourceKey: s.sourceSlotKey,
		label: s.label,
		category: s.category,
		partId: s.partId,
		quantity: s.quantity
	}));
	const partNames = new Map<number, string>();
	for (const s of slots) partNames.set(s.partId, nameOf(s.part));
	for (const { slot } of ctx.baseSlots) partNames.set(slot.pickPartId, nameOf(slot.pick));
	const driftView: DriftView[] = driftOf(sourceSlots, localSlots).rows.map((r) => {
		const label = r.local?.label ?? r.base?.label ?? '';
		// Each kind carries the sides it is about (drift in domain/sync.ts); a side left
		// out reads as an empty name rather than throwing.
		const named = (s: { partId: number; quantity: number } | null) =>
			s
				? `${partNames.get(s.partId) ?? `part ${s.partId}`}${s.quantity > 1 ? ` × ${s.quantity}` : ''}`
				: '';
		switch (r.kind) {
			case 'swapped':
				return { label, kind: r.kind, from: named(r.base), to: named(r.local) };
			case 'quantity':
				return {
					label,
					kind: r.kind,
					from: String(r.base?.quantity ?? ''),
					to: String(r.local?.quantity ?? '')
				};
			case 'added':
				return { label, kind: r.kind, to: named(r.local) };
			case 'removed':
				return { label, kind: r.kind, from: named(r.base) };
			default:
				return { label, kind: r.kind };
		}
	});

	const results = frames.map((f) => ({ averageFps: f.avgFpsTenths / 10 }));
	let value: BuildView['value'] = { build: null, source: null, sourceResultsDiffer: false };
	if (build.baseRevisionId) {
		const buildTotal = unpricedSlots === 0 && slotViews.length > 0 ? planned : null;
		const sourceLines = ctx.baseSlots.map(({ slot }) => {
			const line = ctx.priceOf(slot.pick, slot.category, slot.priceQuote);
			noteRate(line);
			return line.unit ? multiply(line.unit, slot.quantity) : null;
		});
		const sourceTotal =
			sourceLines.length > 0 && sourceLines.every((m) => m !== null)
				? sum(sourceLines as Money[], currency)
				: null;
		const idsOf = (parts: { category: string; partId: number }[], category: PartCategory) =>
			parts
				.filter((p) => p.category === category)
				.map((p) => p.partId)
				.sort((a, b) => a - b)
				.join(',');
		const differ = (['cpu', 'gpu'] as const).some(
			(c) => idsOf(localSlots, c) !== idsOf(sourceSlots, c)
		);
		value = {
			build: { ...valueOf(results, buildTotal), total: buildTotal } satisfies ValueView,
			source: { ...valueOf(results, sourceTotal), total: sourceTotal } satisfies ValueView,
			sourceResultsDiffer: differ
		};
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
		power: powerBudget(buildParts),
		drift: driftView,
		value,
		ratesAsOf,
		updatedAt: build.updatedAt.toISOString(),
		// Only the owner and editors get a hidden build at all (see `access`).
		hidden: build.hiddenAt
			? { reason: build.hiddenReason ?? '', hiddenAt: build.hiddenAt.toISOString() }
			: null
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
 * The guide a build was forked from, or null when there is none to show: a guide an editor
 * has hidden is a 404 for readers, so a build (public ones included) names and links it no
 * more than any other page does (issue 12, item 9).
 */
function sourceView(build: LoadedBuild): BuildSourceView | null {
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

/** The reader's builds, most recently changed first (no pricing: cards stay cheap). */
export async function listMine(ownerId: string): Promise<BuildCard[]> {
	const builds = (await Build.findAll({
		where: { ownerId },
		include: [
			{ model: Region, as: 'region' },
			{
				model: Guide,
				as: 'sourceGuide',
				include: [{ model: GuideRevision, as: 'publishedRevision', attributes: ['id', 'number'] }]
			},
			{ model: GuideRevision, as: 'baseRevision', attributes: ['id', 'number'] }
		],
		order: [['updatedAt', 'DESC']]
	})) as LoadedBuild[];
	if (builds.length === 0) return [];
	const slots = await BuildSlot.findAll({
		where: { buildId: builds.map((b) => b.id) },
		attributes: ['buildId', 'purchased']
	});
	return builds.map((b) => {
		const mine = slots.filter((s) => s.buildId === b.id);
		const source = sourceView(b);
		return {
			id: b.id,
			title: b.title,
			visibility: b.visibility as BuildVisibility,
			region: regionSummary(b.region),
			source: source ? { slug: source.slug, title: source.title } : null,
			slotCount: mine.length,
			boughtCount: mine.filter((s) => s.purchased).length,
			newerRevisionAvailable: source?.newerRevisionAvailable ?? false,
			hiddenReason: b.hiddenAt ? (b.hiddenReason ?? '') : null,
			updatedAt: b.updatedAt.toISOString()
		};
	});
}

/** How many builds were forked from a guide, and its public forks (most recent first, at most 50; hidden ones left out). */
export async function lineage(guideSlug: string): Promise<LineageView> {
	const guide = await Guide.findOne({ where: { slug: guideSlug }, attributes: ['id'] });
	if (!guide) return { forkCount: 0, publicBuilds: [] };
	const [forkCount, publicBuilds] = await Promise.all([
		Build.count({ where: { sourceGuideId: guide.id } }),
		Build.findAll({
			where: { sourceGuideId: guide.id, visibility: 'public', hiddenAt: null },
			include: [{ model: User, as: 'owner', attributes: ['name'] }],
			order: [
				['updatedAt', 'DESC'],
				['id', 'DESC']
			],
			limit: 50
		}) as Promise<LoadedBuild[]>
	]);
	return {
		forkCount,
		publicBuilds: publicBuilds.map((b) => ({
			id: b.id,
			title: b.title,
			ownerName: b.owner?.name ?? 'Former member',
			updatedAt: b.updatedAt.toISOString()
		}))
	};
}

// ---------------------------------------------------------------------------------------------
// Changes (owner only, optimistic locking)
// ---------------------------------------------------------------------------------------------

/**
 * Runs one change: bumps the version with `WHERE id AND owner AND version = expected` first
 * (no row: someone changed the build in between, nothing is written), then `work` in the
 * same transaction. The view is read after the commit.
 */
async function change(
	ownerId: string,
	id: number,
	expectedVersion: number,
	buildFields: Partial<
		Pick<
			Build,
			'title' | 'notes' | 'regionId' | 'visibility' | 'budgetMinor' | 'notifyOnNewRevision'
		>
	>,
	work?: (transaction: Transaction) => Promise<void>
): Promise<MutationOutcome> {
	const committed = await sequelize.transaction(async (transaction) => {
		const [affected] = await Build.update(
			{ ...buildFields, version: expectedVersion + 1 },
			{ where: { id, ownerId, version: expectedVersion }, transaction }
		);
		if (affected !== 1) return false;
		if (work) await work(transaction);
		return true;
	});
	const view = await getBuild({ id: ownerId }, id);
	if (!view) return { kind: 'not_found' };
	return committed ? { kind: 'ok', build: view } : { kind: 'conflict', current: view };
}

/** Whether `ownerId` owns build `id` (one indexed lookup; for handlers that check ownership before reading a body). */
export async function ownsBuild(ownerId: string, id: number): Promise<boolean> {
	return (await Build.count({ where: { id, ownerId } })) === 1;
}

async function ownBuild(ownerId: string, id: number): Promise<LoadedBuild | null> {
	const build = await loadBuild(id);
	return build && build.ownerId === ownerId ? build : null;
}

function digitsIssue(currency: string): string {
	const digits = minorUnitDigits(currency);
	return digits === 0 ? `${currency} has no decimals.` : `${currency} has ${digits} decimals.`;
}

export interface BuildPatch {
	title?: string;
	notes?: string;
	regionCode?: string;
	visibility?: BuildVisibility;
	/** Decimal amount in the (new) region's currency; null removes the budget. */
	budget?: string | null;
	notifyOnNewRevision?: boolean;
}

/**
 * Title, notes, region (re-prices everything), visibility, budget and the new-revision
 * e-mail switch. A region with another currency converts a kept budget through EUR at the
 * stored ECB rates (rounded half-even once); without a rate the reader is asked to enter
 * the budget again. Price overrides stay in the currency they were entered in and apply
 * again only in a region with that currency.
 */
export async function updateBuild(
	ownerId: string,
	id: number,
	patch: BuildPatch,
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const issues: Issues = {};
	let region = build.region;
	if (patch.regionCode !== undefined && patch.regionCode !== region.code) {
		const found = await Region.findOne({ where: { code: patch.regionCode } });
		if (!found) issues.regionCode = ['Choose a region from the list.'];
		else region = found;
	}
	const fields: Parameters<typeof change>[3] = {};
	if (patch.title !== undefined) fields.title = patch.title;
	if (patch.notes !== undefined) fields.notes = patch.notes;
	if (patch.visibility !== undefined) fields.visibility = patch.visibility;
	if (patch.notifyOnNewRevision !== undefined)
		fields.notifyOnNewRevision = patch.notifyOnNewRevision;
	if (region.id !== build.regionId) fields.regionId = region.id;
	if (patch.budget !== undefined) {
		if (patch.budget === null) fields.budgetMinor = null;
		else {
			const minor = toMinor(patch.budget, region.currency);
			if (minor === null || !Number.isSafeInteger(minor))
				issues.budget = [digitsIssue(region.currency)];
			else fields.budgetMinor = minor;
		}
	} else if (
		build.budgetMinor !== null &&
		region.currency !== build.region.currency &&
		!issues.regionCode
	) {
		try {
			fields.budgetMinor = convertThroughEur(
				money(Number(build.budgetMinor), build.region.currency),
				region.currency,
				await fx.ratesForPricing()
			).amountMinor;
		} catch (e) {
			if (!(e instanceof MissingRateError)) throw e;
			issues.budget = [
				`There is no exchange rate to convert your budget to ${region.currency}; enter it again in ${region.currency}.`
			];
		}
	}
	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	return change(ownerId, id, expectedVersion, fields);
}

export interface SlotPatch {
	partId?: number;
	quantity?: number;
	/** null removes the override. */
	priceOverride?: { amount: string; store: string; date: string } | null;
	purchase?: {
		purchased: boolean;
		paid?: string | null;
		purchasedAt?: string | null;
		store?: string | null;
	};
}

/**
 * Swap the part (any catalog part of the slot's category; origin follows: the source pick →
 * 'source', one of the base slot's alternates → 'alternate', else 'custom'; a swap drops the
 * price override, which was for the old part), quantity, price override, purchase tracker.
 * Amounts are in the build region's currency with its digits; dates are checked by the schema.
 * `purchased: false` clears what was paid, when and where.
 */
export async function updateSlot(
	ownerId: string,
	id: number,
	slotId: number,
	patch: SlotPatch,
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const slot = await BuildSlot.findOne({ where: { id: slotId, buildId: id } });
	if (!slot) return { kind: 'not_found' };
	const currency = build.region.currency;
	const issues: Issues = {};
	const fields: Partial<BuildSlot> = {};

	if (patch.partId !== undefined && patch.partId !== slot.partId) {
		const part = await Part.findByPk(patch.partId, { attributes: ['id', 'category'] });
		if (!part) issues.partId = ['No such part in the catalog.'];
		else if (part.category !== slot.category)
			issues.partId = [`Choose a part of this slot's category (${slot.category}).`];
		else {
			const baseSlots = build.baseRevisionId
				? keyedRevisionSlots(await loadRevisionSlots([build.baseRevisionId]))
				: [];
			const baseByKey = new Map(baseSlots.map((k) => [k.key, k.slot]));
			fields.partId = part.id;
			fields.origin = originOf({ baseByKey } as PricingContext, slot.sourceSlotKey, part.id);
			if (patch.priceOverride === undefined) Object.assign(fields, clearedOverride());
		}
	}
	if (patch.quantity !== undefined) fields.quantity = patch.quantity;
	if (patch.priceOverride === null) Object.assign(fields, clearedOverride());
	else if (patch.priceOverride) {
		const minor = toMinor(patch.priceOverride.amount, currency);
		if (minor === null || !Number.isSafeInteger(minor))
			issues['priceOverride.amount'] = [digitsIssue(currency)];
		else
			Object.assign(fields, {
				priceOverrideMinor: minor,
				priceOverrideCurrency: currency,
				priceOverrideStore: patch.priceOverride.store,
				priceOverrideDate: patch.priceOverride.date
			});
	}
	if (patch.purchase) {
		const p = patch.purchase;
		if (!p.purchased) {
			Object.assign(fields, {
				purchased: false,
				paidMinor: null,
				paidCurrency: null,
				purchasedAt: null,
				purchaseStore: null
			});
		} else {
			fields.purchased = true;
			if (p.paid === null) Object.assign(fields, { paidMinor: null, paidCurrency: null });
			else if (p.paid !== undefined) {
				const minor = toMinor(p.paid, currency);
				if (minor === null || !Number.isSafeInteger(minor))
					issues['purchase.paid'] = [digitsIssue(currency)];
				else Object.assign(fields, { paidMinor: minor, paidCurrency: currency });
			}
			if (p.purchasedAt !== undefined) fields.purchasedAt = p.purchasedAt ?? null;
			if (p.store !== undefined) fields.purchaseStore = p.store ? p.store : null;
		}
	}
	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	return change(ownerId, id, expectedVersion, {}, async (transaction) => {
		if (Object.keys(fields).length > 0)
			await BuildSlot.update(fields, { where: { id: slot.id, buildId: id }, transaction });
	});
}

function clearedOverride(): Partial<BuildSlot> {
	return {
		priceOverrideMinor: null,
		priceOverrideCurrency: null,
		priceOverrideStore: null,
		priceOverrideDate: null
	};
}

/** A slot of the reader's own (no source key, origin 'custom'), placed last. */
export async function addSlot(
	ownerId: string,
	id: number,
	input: { category: PartCategory; label: string; partId: number; quantity: number },
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const issues: Issues = {};
	const part = await Part.findByPk(input.partId, { attributes: ['id', 'category'] });
	if (!part) issues.partId = ['No such part in the catalog.'];
	else if (part.category !== input.category)
		issues.partId = [`Choose a part of the slot's category (${input.category}).`];
	const count = await BuildSlot.count({ where: { buildId: id } });
	if (count >= MAX_BUILD_SLOTS) issues._form = [`A build has at most ${MAX_BUILD_SLOTS} slots.`];
	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	return change(ownerId, id, expectedVersion, {}, async (transaction) => {
		const last = (await BuildSlot.max('position', { where: { buildId: id }, transaction })) as
			number | null;
		await BuildSlot.create(
			{
				buildId: id,
				sourceSlotKey: null,
				category: input.category,
				label: input.label,
				position: (last ?? 0) + 1,
				partId: input.partId,
				quantity: input.quantity,
				origin: 'custom'
			},
			{ transaction }
		);
	});
}

export async function removeSlot(
	ownerId: string,
	id: number,
	slotId: number,
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const slot = await BuildSlot.findOne({ where: { id: slotId, buildId: id }, attributes: ['id'] });
	if (!slot) return { kind: 'not_found' };
	return change(ownerId, id, expectedVersion, {}, async (transaction) => {
		await BuildSlot.destroy({ where: { id: slotId, buildId: id }, transaction });
	});
}

// ---------------------------------------------------------------------------------------------
// CSV shopping list
// ---------------------------------------------------------------------------------------------

export const BUILD_CSV_COLUMNS = [
	'slot',
	'part',
	'quantity',
	'unit price',
	'line total',
	'currency',
	'status',
	'store',
	'bought',
	'paid'
] as const;

/** Minor units as a plain decimal in the currency's digits: 69999 USD → "699.99", −500 → "-5.00". */
export function decimalOf(m: Money): string {
	const digits = minorUnitDigits(m.currency);
	const negative = m.amountMinor < 0;
	const text = String(Math.abs(m.amountMinor)).padStart(digits + 1, '0');
	const body = digits === 0 ? text : `${text.slice(0, -digits)}.${text.slice(-digits)}`;
	return `${negative ? '-' : ''}${body}`;
}

/**
 * The shopping list as CSV in the build's region and currency (or `opts.regionCode`), with
 * the same visibility as getBuild (null → 404). Rows: one per slot, then totals. Bought and
 * paid are the owner's only (empty for others). Text cells that a spreadsheet would run as a
 * formula get a leading quote (services/catalog-csv neutraliseCell); amounts we format
 * ourselves ("-12.50" left of budget) are plain numbers and stay numbers.
 */
export async function exportCsv(
	viewer: Viewer,
	id: number,
	opts: { shareToken?: string; regionCode?: string } = {}
): Promise<string | null> {
	const view = await getBuild(viewer, id, opts);
	if (!view) return null;
	const currency = view.region.currency;
	const amount = (m: Money | null) => (m ? decimalOf(m) : '');
	const rows: string[][] = [[...BUILD_CSV_COLUMNS]];
	for (const s of view.slots) {
		const paid = s.purchase.paid;
		rows.push([
			neutraliseCell(s.label),
			neutraliseCell(`${s.part.brand} ${s.part.model}`),
			String(s.quantity),
			amount(s.price?.unit ?? null),
			amount(s.lineTotal),
			currency,
			s.price?.status ?? 'unpriced',
			neutraliseCell(s.price?.storeName ?? ''),
			view.isOwner ? (s.purchase.purchased ? 'yes' : 'no') : '',
			paid
				? paid.currency === currency
					? decimalOf(paid)
					: neutraliseCell(`${decimalOf(paid)} ${paid.currency}`)
				: ''
		]);
	}
	const total = (label: string, m: Money | null) => [
		label,
		'',
		'',
		'',
		amount(m),
		currency,
		'',
		'',
		'',
		''
	];
	rows.push(total('Planned total', view.totals.planned));
	if (view.isOwner) {
		rows.push(total('Spent', view.totals.spent));
		rows.push(total('Remaining to buy', view.totals.remainingToBuy));
		if (view.totals.leftOfBudget) rows.push(total('Left of budget', view.totals.leftOfBudget));
	}
	if (view.totals.unpricedSlots > 0)
		rows.push([
			`Slots without a price (not in the totals): ${view.totals.unpricedSlots}`,
			'',
			'',
			'',
			'',
			'',
			'',
			'',
			'',
			''
		]);
	return stringify(rows, { record_delimiter: '\r\n' });
}

/** "slotwise-build-12-2026-12-02.csv" */
export function csvFilename(id: number, now = new Date()): string {
	return `slotwise-build-${id}-${now.toISOString().slice(0, 10)}.csv`;
}

// ---------------------------------------------------------------------------------------------
// Helpers shared with services/guides.ts's pricing (same rules, own copies: that file keeps them private)
// ---------------------------------------------------------------------------------------------

/** Latest active quote per part in a region (any store). */
async function latestQuotes(partIds: number[], regionId: number): Promise<Map<number, QuoteInput>> {
	const result = new Map<number, QuoteInput>();
	if (partIds.length === 0) return result;
	const quotes = (await Quote.findAll({
		where: { partId: partIds, regionId, status: 'active' },
		include: [{ model: Store, as: 'store' }],
		order: [
			['observedAt', 'DESC'],
			['id', 'DESC']
		]
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
	return {
		id: p.id,
		slug: p.slug,
		brand: p.brand,
		model: p.model,
		category: p.category as PartCategory
	};
}

function partInfo(p: Part): PartInfo {
	return { brand: p.brand, model: p.model, specs: p.specs } as unknown as PartInfo;
}

function nameOf(p: Part): string {
	return `${p.brand} ${p.model}`;
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
