/**
 * Published guides as plain objects for pages and the API. The only module that reads
 * guide models. Prices are shown in a region: the guide's base region by default, or any
 * region a reader picks, where lines are quoted (a store's price there) or estimated from
 * the base price (domain/region.ts).
 */
import { Op } from 'sequelize';
import type { BuildPart } from '$lib/domain/build-parts';
import { dropIns } from '$lib/domain/dropins';
import type { DropInResult, DropInReport, GuideSlot as DropInSlot } from '$lib/domain/dropins';
import { summarize } from '$lib/domain/fit';
import type { CautionRule } from '$lib/domain/pairing-cautions';
import { money, subtract } from '$lib/domain/money';
import { powerBudget } from '$lib/domain/power';
import { reproducibility } from '$lib/domain/reproducibility';
import { revisionDiff } from '$lib/domain/revision-diff';
import { valueOf } from '$lib/domain/value';
import { adjustToRegion } from '$lib/domain/region';
import type {
	OptionInput,
	PricedLine,
	QuoteInput,
	RatesPerEur,
	RegionPricing,
	SlotInput
} from '$lib/domain/region';
import type { AlternateReason, PartCategory, TaxMode } from '$lib/domain/types';
import {
	FrameResult,
	Guide,
	GuideRevision,
	Part,
	Quote,
	Region,
	Store,
	ThermalResult,
	User
} from '$lib/server/db';
import * as fx from './fx';
import { activeRules } from './caution-rules';
import { loadRevisionSlots, snapshotOf } from './revision-snapshots';
import type { QuoteWithStore } from './revision-snapshots';
import type {
	DropInView,
	FrameResultView,
	GuideCard,
	GuideDetail,
	GuidePage,
	PartRef,
	PriceLine,
	PricedGuide,
	RegionSummary,
	RevisionDiff,
	SlotView
} from './guide-views';

export type { GuideCard, GuideDetail, GuidePage, PricedGuide } from './guide-views';

/** Published guides, featured first, newest first, priced in their base regions. */
export async function listPublished(): Promise<GuideCard[]> {
	const guides = await Guide.findAll({
		// Hidden guides (services/content-reports) are left out of every public list.
		where: { state: 'published', publishedRevisionId: { [Op.ne]: null }, hiddenAt: null },
		include: guideIncludes(),
		order: [
			['featured', 'DESC'],
			['updatedAt', 'DESC']
		]
	});
	const result: GuideCard[] = [];
	for (const guide of guides) {
		const priced = await price(guide as LoadedGuide, null, null);
		if (priced) result.push(toCard(priced.guide));
	}
	return result;
}

/** The published guide in its base region, or null when there is none. */
export async function getPublishedBySlug(slug: string): Promise<GuideDetail | null> {
	const guide = await findPublished(slug);
	if (!guide) return null;
	return (await price(guide, null, null))?.guide ?? null;
}

export type PricedOutcome =
	{ kind: 'ok'; guide: PricedGuide } | { kind: 'not_found' } | { kind: 'unknown_region' };

/**
 * The published guide priced in `regionCode` (its base region when null): the guide page
 * and GET /api/v1/guides/[slug]/pricing.
 */
export async function getPriced(slug: string, regionCode: string | null): Promise<PricedOutcome> {
	const outcome = await getGuidePage(slug, regionCode);
	return outcome.kind === 'ok' ? { kind: 'ok', guide: outcome.page.guide } : outcome;
}

export type GuidePageOutcome =
	{ kind: 'ok'; page: GuidePage } | { kind: 'not_found' } | { kind: 'unknown_region' };

/**
 * The guide page: the priced guide (with value and reproducibility in the region) plus fit
 * report, power budget, results, build notes and revision list. A constant number of
 * queries whatever the slot count (tests/integration/guide-page.spec.ts counts them).
 */
export async function getGuidePage(
	slug: string,
	regionCode: string | null,
	now = new Date(),
	viewer: GuideViewer | null = null
): Promise<GuidePageOutcome> {
	const guide = await findPublished(slug, viewer);
	if (!guide) return { kind: 'not_found' };
	let target: Region | null = null;
	if (regionCode) {
		target = await Region.findOne({ where: { code: regionCode } });
		if (!target) return { kind: 'unknown_region' };
	}
	const revision = guide.publishedRevision;
	if (!revision) return { kind: 'not_found' };
	const [frames, thermals, revisions, cautionRules] = await Promise.all([
		FrameResult.findAll({
			where: { revisionId: revision.id },
			order: [
				['position', 'ASC'],
				['id', 'ASC']
			]
		}),
		ThermalResult.findAll({
			where: { revisionId: revision.id },
			order: [
				['position', 'ASC'],
				['id', 'ASC']
			]
		}),
		GuideRevision.findAll({
			where: { guideId: guide.id, publishedAt: { [Op.ne]: null } },
			attributes: ['number', 'publishedAt', 'submittedAt'],
			order: [['number', 'ASC']]
		}),
		activeRules()
	]);
	const frameViews: FrameResultView[] = frames.map((f) => ({
		workload: f.workload,
		resolution: f.resolution,
		preset: f.preset,
		averageFps: f.avgFpsTenths / 10,
		low1Fps: f.low1FpsTenths === null ? null : f.low1FpsTenths / 10,
		notes: f.notes
	}));
	const priced = await price(guide, target, { frames: frameViews, now, cautionRules });
	if (!priced) return { kind: 'not_found' };
	const { guide: pricedGuide, build, drop } = priced;
	const slotLabels = Object.fromEntries(build.map((b) => [b.key, b.label]));
	return {
		kind: 'ok',
		page: {
			hidden: guide.hiddenAt
				? { reason: guide.hiddenReason ?? '', hiddenAt: guide.hiddenAt.toISOString() }
				: null,
			guide: { ...pricedGuide, regions: await listRegions() },
			extras: {
				fit: { findings: drop.picks, summary: summarize(drop.picks), slotLabels },
				power: powerBudget(build),
				frames: frameViews,
				thermals: thermals.map((t) => ({
					loadName: t.loadName,
					cpuTempC: t.cpuTempC,
					gpuTempC: t.gpuTempC,
					cpuUtilPct: t.cpuUtilPct,
					gpuUtilPct: t.gpuUtilPct
				})),
				buildNotesHtml: revision.buildNotesHtml ?? null,
				disclosure: { kind: guide.disclosure ?? 'none', note: guide.disclosureNote ?? null },
				walkthroughUrl: safeHttpsUrl(guide.walkthroughUrl ?? null),
				revisions: revisions.map((r) => ({
					number: r.number,
					publishedAt: r.publishedAt?.toISOString() ?? null,
					submittedAt: r.submittedAt?.toISOString() ?? null
				}))
			}
		}
	};
}

/** Only https links are shown; anything else stored by mistake is left out. */
function safeHttpsUrl(url: string | null): string | null {
	if (!url) return null;
	try {
		return new URL(url).protocol === 'https:' ? url : null;
	} catch {
		return null;
	}
}

export type RevisionDiffOutcome = { kind: 'ok'; diff: RevisionDiff } | { kind: 'not_found' };

/** Differences between two published revisions of a published guide (three queries). */
export async function getRevisionDiff(
	slug: string,
	from: number,
	to: number,
	viewer: GuideViewer | null = null
): Promise<RevisionDiffOutcome> {
	const guide = await Guide.findOne({
		where: { slug, state: 'published', publishedRevisionId: { [Op.ne]: null } },
		attributes: ['id', 'authorId', 'hiddenAt']
	});
	if (!guide || !mayView(guide, viewer)) return { kind: 'not_found' };
	const revisions = await GuideRevision.findAll({
		where: { guideId: guide.id, number: [from, to], publishedAt: { [Op.ne]: null } }
	});
	const a = revisions.find((r) => r.number === from);
	const b = revisions.find((r) => r.number === to);
	if (!a || !b) return { kind: 'not_found' };
	const slots = await loadRevisionSlots([a.id, b.id]);
	return { kind: 'ok', diff: revisionDiff(snapshotOf(a, slots), snapshotOf(b, slots)) };
}

async function findPublished(
	slug: string,
	viewer: GuideViewer | null = null
): Promise<LoadedGuide | null> {
	const guide = (await Guide.findOne({
		where: { slug, state: 'published', publishedRevisionId: { [Op.ne]: null } },
		include: guideIncludes()
	})) as LoadedGuide | null;
	return guide && mayView(guide, viewer) ? guide : null;
}

/** Who is looking at a guide page: hidden guides are shown only to their author and editors. */
export interface GuideViewer {
	id: string;
	role: string;
}

/** A hidden guide (services/content-reports) is a 404 for everyone but its author, editors and admins. */
function mayView(guide: Pick<Guide, 'hiddenAt' | 'authorId'>, viewer: GuideViewer | null): boolean {
	if (!guide.hiddenAt) return true;
	if (!viewer) return false;
	return viewer.role === 'editor' || viewer.role === 'admin' || viewer.id === guide.authorId;
}

function guideIncludes() {
	return [
		{ model: User, as: 'author', attributes: ['name'] },
		{ model: Region, as: 'baseRegion' },
		{ model: GuideRevision, as: 'publishedRevision' }
	];
}

type LoadedGuide = Guide & {
	author?: User | null;
	baseRegion?: Region;
	publishedRevision?: GuideRevision | null;
};

interface Priced {
	guide: PricedGuide;
	/** The picks as the fit report and power budget take them (key: slot id). */
	build: BuildPart[];
	drop: DropInReport;
}

/**
 * Prices the guide in `target` (null: its base region, using the author's chosen quotes).
 * With `detail` (the guide page and pricing API) it also works out drop-ins, value and
 * reproducibility in the region; cards skip them.
 */
async function price(
	guide: LoadedGuide,
	target: Region | null,
	detail: { frames: FrameResultView[]; now: Date; cautionRules?: CautionRule[] } | null
): Promise<Priced | null> {
	const base = guide.baseRegion;
	const revision = guide.publishedRevision;
	if (!base || !revision) return null;
	const region = target ?? base;
	const inBase = region.id === base.id;

	const slots = await loadRevisionSlots([revision.id]);
	const allPartIds = slots.flatMap((s) => [s.pick.id, ...s.alternates.map((a) => a.part.id)]);
	const baseQuotes = await latestQuotes(allPartIds, base.id);
	const targetQuotes = inBase ? baseQuotes : await latestQuotes(allPartIds, region.id);
	// Rates matter only when prices cross a currency or tax regime.
	const rates: RatesPerEur = inBase ? {} : await fx.ratesForPricing();

	const option = (part: Part, chosen: QuoteWithStore | null): OptionInput => {
		const basePrice = chosen ? quoteInput(chosen) : (baseQuotes.get(part.id) ?? null);
		return {
			partId: part.id,
			basePrice,
			targetQuote: inBase ? basePrice : (targetQuotes.get(part.id) ?? null)
		};
	};
	const inputs: SlotInput[] = slots.map((s) => ({
		key: s.id,
		category: s.category,
		quantity: s.quantity,
		pick: option(s.pick, s.priceQuote),
		alternates: s.alternates.map((a) => option(a.part, null))
	}));
	const adjusted = adjustToRegion({
		base: pricingOf(base),
		target: pricingOf(region),
		slots: inputs,
		rates
	});

	const dropSlots: DropInSlot[] = slots.map(
		(s) =>
			({
				key: String(s.id),
				label: s.label,
				category: s.category,
				quantity: s.quantity,
				pick: partInfo(s.pick),
				alternates: s.alternates.map((a) => ({ id: a.id, part: partInfo(a.part) }))
			}) as unknown as DropInSlot
	);
	const build = dropSlots.map(
		(d) =>
			({
				key: d.key,
				label: d.label,
				category: d.category,
				quantity: d.quantity,
				part: d.pick
			}) as unknown as BuildPart
	);
	const drop: DropInReport = detail
		? dropIns(dropSlots, detail.cautionRules)
		: { picks: [], alternates: [] };
	const dropByAlternate = new Map(drop.alternates.map((r) => [r.alternateId, r]));

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
					deltaFromPick: altPrice && pickPrice ? subtract(altPrice.unit, pickPrice.unit) : null,
					...(detail ? { dropIn: dropInView(dropByAlternate.get(alt.id)) } : {})
				};
			})
		};
	});

	const ratesAsOf = adjusted.oldestRateAsOf;
	const pricedGuide: PricedGuide = {
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
	if (detail) {
		// Value is only meaningful against a complete total.
		const total = adjusted.unpricedSlots === 0 ? adjusted.picksTotal : null;
		pricedGuide.value = valueOf(detail.frames, total);
		const reproSlots = slots.map((s) => ({
			label: s.label,
			latestQuoteAt: targetQuotes.get(s.pick.id)?.observedAt ?? null,
			hasDropInAlternate: drop.alternates.some((r) => r.slotKey === String(s.id) && r.fits)
		}));
		pricedGuide.reproducibility = {
			...reproducibility({ regionName: region.name, slots: reproSlots, now: detail.now }),
			slots: reproSlots
		};
	}
	return { guide: pricedGuide, build, drop };
}

function partInfo(p: Part) {
	return { brand: p.brand, model: p.model, specs: p.specs };
}

function dropInView(result: DropInResult | undefined): DropInView | undefined {
	if (!result) return undefined;
	const changed = result.changed.map((f) => ({
		severity: f.severity,
		before: f.before,
		message: f.message
	}));
	const status = !result.fits
		? 'no-fit'
		: changed.some((c) => c.severity === 'caution')
			? 'caution'
			: 'fits';
	return { status, changed, gone: result.gone.map((f) => f.message) };
}

function toCard(detail: GuideDetail): GuideCard {
	const { slots: _slots, totalRange: _range, revisionNumber: _n, ...rest } = detail;
	const {
		region: _r,
		regions: _rs,
		picks: _p,
		ratesAsOf: _a,
		ratesStale: _s,
		...card
	} = rest as PricedGuide;
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
	return {
		id: p.id,
		slug: p.slug,
		brand: p.brand,
		model: p.model,
		category: p.category as PartCategory
	};
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
	/** Set while an editor has hidden the guide: the reason its author is shown. */
	hiddenReason: string | null;
}

/** The guides an author owns, in any state, most recently changed first. */
export async function listByAuthor(authorId: string): Promise<AuthoredGuide[]> {
	const rows = await Guide.findAll({ where: { authorId }, order: [['updatedAt', 'DESC']] });
	return rows.map((g) => ({
		slug: g.slug,
		title: g.title,
		state: g.state,
		updatedAt: g.updatedAt.toISOString(),
		published: g.state === 'published' && g.publishedRevisionId !== null,
		hiddenReason: g.hiddenAt ? (g.hiddenReason ?? '') : null
	}));
}
