/**
 * One published guide as plain objects for its page and the API: priced in a region through
 * the pricing service (the guide's base region by default, or any region a reader picks,
 * where lines are quoted or estimated from the base price), with fit report, drop-ins, power
 * budget, value, reproducibility and revision history. Lists of guides are guide-browse.ts's.
 */
import { Op } from 'sequelize';
import type { BuildPart } from '$lib/domain/build-parts';
import { dropIns } from '$lib/domain/dropins';
import type { DropInResult, DropInReport } from '$lib/domain/dropins';
import { summarize } from '$lib/domain/fit';
import type { CautionRule } from '$lib/domain/pairing-cautions';
import { money, subtract } from '$lib/domain/money';
import { powerBudget } from '$lib/domain/power';
import type { RegionAdjustment } from '$lib/domain/region';
import { reproducibility } from '$lib/domain/reproducibility';
import { revisionDiff } from '$lib/domain/revision-diff';
import type { AlternateReason } from '$lib/domain/types';
import { valueOf } from '$lib/domain/value';
import { budgetIn } from '$lib/domain/budget';
import { FrameResult, Guide, GuideRevision, Region, ThermalResult, User } from '$lib/server/db';
import type {
	DropInView,
	FrameResultView,
	GuideCard,
	GuideDetail,
	GuidePage,
	PricedGuide,
	RegionSummary,
	RevisionDiff,
	SlotView
} from '$lib/views';
import { activeRules } from './caution-rules';
import * as fx from './fx';
import { dropInSlot, partRef, picksOf, regionSummary } from './mappers';
import { priceRevisionsIn } from './pricing';
import { allRegions, regionByCode } from './reference-cache';
import { loadRevisionSlots, snapshotOf } from './revision-snapshots';

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
	if (outcome.kind !== 'ok') return outcome;
	return { kind: 'ok', guide: outcome.page.guide };
}

export type GuidePageOutcome =
	| { kind: 'ok'; page: GuidePage; guideId: number }
	| { kind: 'not_found' }
	| { kind: 'unknown_region' };

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
		target = await regionByCode(regionCode);
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
		guideId: guide.id,
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
export function mayView(
	guide: { hiddenAt: Date | null; authorId: string | null },
	viewer: GuideViewer | null
): boolean {
	if (!guide.hiddenAt) return true;
	if (!viewer) return false;
	return viewer.role === 'editor' || viewer.role === 'admin' || viewer.id === guide.authorId;
}

/** What every published-guide read loads with the guide: author, base region, published revision. */
export function guideIncludes() {
	return [
		// handle and disabledAt: the guide page links the author's page (authors.ts).
		{ model: User, as: 'author', attributes: ['name', 'handle', 'disabledAt'] },
		{ model: Region, as: 'baseRegion' },
		{ model: GuideRevision, as: 'publishedRevision' }
	];
}

export type LoadedGuide = Guide & {
	author?: User | null;
	baseRegion?: Region;
	publishedRevision?: GuideRevision | null;
};

/** A published guide's card from its pricing: what lists, browse and the feed show. */
export function cardOf(
	guide: LoadedGuide,
	base: Region,
	revision: GuideRevision,
	adjustment: RegionAdjustment
): GuideCard {
	return {
		slug: guide.slug,
		title: guide.title,
		summary: guide.summary,
		authorName: guide.author?.name ?? 'Former member',
		targetBudget: money(Number(guide.targetBudgetMinor), base.currency),
		baseRegion: regionSummary(base),
		tags: guide.tags,
		featured: guide.featured,
		picksTotal: adjustment.picksTotal,
		unpricedSlots: adjustment.unpricedSlots,
		publishedAt: (revision.publishedAt ?? guide.updatedAt).toISOString()
	};
}

interface Priced {
	guide: PricedGuide;
	/** The picks as the fit report and power budget take them (key: slot id). */
	build: BuildPart[];
	drop: DropInReport;
}

/**
 * Prices the guide in `target` (null: its base region, using the author's chosen quotes)
 * through the pricing service. With `detail` (the guide page and pricing API) it also works
 * out drop-ins, value and reproducibility in the region.
 */
async function price(
	guide: LoadedGuide,
	target: Region | null,
	detail: { frames: FrameResultView[]; now: Date; cautionRules?: CautionRule[] } | null
): Promise<Priced | null> {
	const base = guide.baseRegion;
	const revision = guide.publishedRevision;
	if (!base || !revision) return null;
	const pricing = await priceRevisionsIn([{ revisionId: revision.id, base }], target);
	const priced = pricing.revisions.get(revision.id);
	if (!priced) return null;
	const { slots, adjustment, prices, region } = priced;

	const dropSlots = slots.map((s) => dropInSlot(String(s.id), s, s.pick, s.alternates));
	const build = picksOf(dropSlots);
	const drop: DropInReport = detail
		? dropIns(dropSlots, detail.cautionRules)
		: { picks: [], alternates: [] };
	const dropByAlternate = new Map(drop.alternates.map((r) => [r.alternateId, r]));

	const slotViews: SlotView[] = slots.map((slot, i) => {
		const pickPrice = prices[i]?.pick ?? null;
		return {
			id: slot.id,
			slotKey: slot.slotKey,
			category: slot.category,
			label: slot.label,
			position: slot.position,
			quantity: slot.quantity,
			pick: partRef(slot.pick),
			reason: slot.reason,
			price: pickPrice,
			lineTotal: adjustment.slots[i]?.lineTotal ?? null,
			alternates: slot.alternates.map((alt, j) => {
				const altPrice = prices[i]?.alternates[j] ?? null;
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

	// The budget is read in the shown region's currency, so totals and the over/under line
	// never mix two currencies (issue 15); the rate's date joins the estimates' one.
	const card = cardOf(guide, base, revision, adjustment);
	const budget = budgetIn(card.targetBudget, region.currency, pricing.rates);
	const ratesAsOf =
		[adjustment.oldestRateAsOf, budget.asOf].filter((d): d is string => d !== null).sort()[0] ??
		null;
	const pricedGuide: PricedGuide = {
		...card,
		authorHandle: guide.author && !guide.author.disabledAt ? guide.author.handle : null,
		budgetInRegion: budget.money,
		revisionNumber: revision.number,
		slots: slotViews,
		totalRange: adjustment.range,
		region: regionSummary(region),
		regions: [],
		picks: adjustment.picks,
		ratesAsOf,
		ratesStale: ratesAsOf !== null && fx.rateAgeDays(ratesAsOf, new Date()) > fx.STALE_AFTER_DAYS
	};
	if (detail) {
		// Value is only meaningful against a complete total.
		const total = adjustment.unpricedSlots === 0 ? adjustment.picksTotal : null;
		pricedGuide.value = valueOf(detail.frames, total);
		const reproSlots = slots.map((s) => ({
			label: s.label,
			latestQuoteAt: pricing.latestQuote(s.pick.id, region.id)?.observedAt ?? null,
			hasDropInAlternate: drop.alternates.some((r) => r.slotKey === String(s.id) && r.fits)
		}));
		pricedGuide.reproducibility = {
			...reproducibility({ regionName: region.name, slots: reproSlots, now: detail.now }),
			slots: reproSlots
		};
	}
	return { guide: pricedGuide, build, drop };
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

/** Every region, for the switcher. */
export async function listRegions(): Promise<RegionSummary[]> {
	return (await allRegions()).map(regionSummary);
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
