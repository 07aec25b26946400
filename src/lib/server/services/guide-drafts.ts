/**
 * Authoring guides, reading: the author's working copy, the editor's choices and the preview
 * of build notes. Creating, saving and submitting are guide-draft-edits.ts's. Authors reach
 * only their own guides: another author's slug gives null / not_found, exactly like a slug
 * that does not exist.
 *
 * Revisions and states (decided here, see the report to the lead):
 * - The working copy is the guide's latest revision while its `submittedAt` is null.
 * - Submitting stamps `submittedAt`: that revision is frozen for good. The next save creates
 *   revision N+1 from the input; only frame/thermal results the input leaves out (older API
 *   clients) are copied from the frozen revision, as new rows.
 * - `guides.state` is the guide's public lifecycle. A guide with a published revision stays
 *   'published' (its `publishedRevisionId` stays live) while a newer revision is drafted or
 *   waits for review; the newest revision's own state is read from its timestamps
 *   (`revisionState`: draft / submitted). A guide never published goes draft → in_review.
 */
import type { Transaction } from 'sequelize';
import { minorToDecimal } from '$lib/domain/money';
import {
	GUIDE_TAGS,
	joinBuildNotes,
	tenthsToFps,
	splitBuildNotes,
	type BuildNotesInput,
	type GuideTag
} from '$lib/schemas/guide-editor';
import {
	FrameResult,
	Guide,
	GuidePriceProposal,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	SlotAlternate,
	Store,
	ThermalResult
} from '$lib/server/db';
import { detailsOf } from '$lib/server/db/models/GuideRevision';
import { renderMarkdown } from '$lib/server/markdown';
import type { DraftPartRef, DraftView, EditorCatalog } from '$lib/views';
import { galleryItems } from './gallery';
import { proposalsByPosition } from './guide-price-proposals';
import { partRef } from './mappers';

/** The author's own guide by slug, or null. */
export async function ownGuide(authorId: string, slug: string, transaction?: Transaction) {
	return Guide.findOne({ where: { slug, authorId }, transaction });
}

/** The newest revision of a guide, frozen or not. */
export async function latestRevision(guideId: number, transaction?: Transaction) {
	return GuideRevision.findOne({ where: { guideId }, order: [['number', 'DESC']], transaction });
}

type LoadedSlot = GuideSlot & {
	pick: Part;
	priceQuote: Quote | null;
	alternates: (SlotAlternate & { part: Part })[];
};

/** The author's working copy of their guide, or null (unknown slug or someone else's). */
export async function getDraft(
	authorId: string,
	slug: string,
	transaction?: Transaction
): Promise<DraftView | null> {
	const guide = await ownGuide(authorId, slug, transaction);
	if (!guide) return null;
	return viewOf(guide, transaction);
}

/** The working copy of `guide` as the editor shows it. */
export async function viewOf(guide: Guide, transaction?: Transaction): Promise<DraftView> {
	const revision = await latestRevision(guide.id, transaction);
	// The working copy's details are the latest revision's, not the guide row's live copy.
	const details = revision ? detailsOf(revision) : detailsOf(guide);
	const region = await Region.findByPk(details.baseRegionId, { transaction });
	const currency = region?.currency ?? 'USD';
	const proposals = revision
		? await proposalsByPosition(revision.id, transaction)
		: new Map<number, GuidePriceProposal>();
	const slots = revision
		? ((await GuideSlot.findAll({
				where: { revisionId: revision.id },
				include: [
					{ model: Part, as: 'pick' },
					{ model: Quote, as: 'priceQuote' },
					{ model: SlotAlternate, as: 'alternates', include: [{ model: Part, as: 'part' }] }
				],
				order: [
					['position', 'ASC'],
					[{ model: SlotAlternate, as: 'alternates' }, 'rank', 'ASC']
				],
				transaction
			})) as LoadedSlot[])
		: [];
	const order: [string, string][] = [
		['position', 'ASC'],
		['id', 'ASC']
	];
	const frames = revision
		? await FrameResult.findAll({ where: { revisionId: revision.id }, order, transaction })
		: [];
	const thermals = revision
		? await ThermalResult.findAll({ where: { revisionId: revision.id }, order, transaction })
		: [];
	const published = guide.publishedRevisionId
		? await GuideRevision.findByPk(guide.publishedRevisionId, { transaction })
		: null;
	const known = new Set<string>(GUIDE_TAGS);
	return {
		slug: guide.slug,
		title: details.title,
		summary: details.summary,
		targetBudget: minorToDecimal(details.targetBudgetMinor, currency),
		currency,
		baseRegion: region?.code ?? '',
		// Tags outside the fixed list (older data) are dropped on the next save.
		tags: details.tags.filter((t): t is GuideTag => known.has(t)),
		disclosure: details.disclosure,
		disclosureNote: details.disclosureNote,
		walkthroughUrl: details.walkthroughUrl,
		buildNotes: splitBuildNotes(revision?.buildNotesMd ?? ''),
		buildNotesHtml: revision?.buildNotesHtml ?? '',
		slots: slots.map((s) => ({
			slotKey: s.slotKey,
			category: s.category,
			label: s.label,
			quantity: s.quantity,
			pickPartId: s.pick.id,
			pick: partRef(s.pick),
			reason: s.reason,
			// A draft's typed price is a proposal; an approved revision's is its quote.
			priceQuote: priceFields(proposals.get(s.position) ?? s.priceQuote),
			alternates: s.alternates.map((a) => ({
				partId: a.part.id,
				part: partRef(a.part),
				reasonTag: a.reasonTag,
				note: a.note
			}))
		})),
		frames: frames.map((f) => ({
			workload: f.workload,
			resolution: f.resolution,
			preset: f.preset,
			avgFps: tenthsToFps(f.avgFpsTenths),
			low1Fps: f.low1FpsTenths === null ? null : tenthsToFps(f.low1FpsTenths),
			notes: f.notes
		})),
		thermals: thermals.map((t) => ({
			loadName: t.loadName,
			cpuTempC: t.cpuTempC,
			gpuTempC: t.gpuTempC,
			cpuUtilPct: t.cpuUtilPct,
			gpuUtilPct: t.gpuUtilPct
		})),
		gallery: revision ? await galleryItems(revision.id, transaction) : [],
		version: guide.version,
		state: guide.state,
		revisionNumber: revision?.number ?? 0,
		revisionState: revision?.submittedAt ? 'submitted' : 'draft',
		submittedAt: revision?.submittedAt?.toISOString() ?? null,
		publishedRevisionNumber: published?.number ?? null
	};
}

/** A proposal or quote as the editor's price fields show it. */
function priceFields(p: GuidePriceProposal | Quote | null) {
	if (!p) return null;
	return {
		storeId: p.storeId,
		amount: minorToDecimal(Number(p.amountMinor), p.currency),
		observedAt: p.observedAt.toISOString().slice(0, 10)
	};
}

/** Sanitised HTML for the editor's preview; nothing is stored. */
export function previewNotes(notes: BuildNotesInput): string {
	return renderMarkdown(joinBuildNotes(notes));
}

/** The regions an author or a build's owner chooses from (a short list, A–Z). */
export async function editorRegions(): Promise<EditorCatalog['regions']> {
	const regions = await Region.findAll({ order: [['name', 'ASC']] });
	return regions.map((r) => ({ code: r.code, name: r.name, currency: r.currency }));
}

/**
 * The editor's choices for `draft`: regions and stores for its selects, and the parts the
 * draft names (picks and alternates) plus `extra` (a suggested alternate), so the page names
 * them. Never the whole catalog: the pickers search it, so the page's size does not grow
 * with the catalog.
 */
export async function editorCatalog(
	draft: DraftView,
	extra: DraftPartRef[] = []
): Promise<EditorCatalog> {
	const regions = await Region.findAll({ order: [['name', 'ASC']] });
	const byId = new Map(regions.map((r) => [r.id, r.code]));
	const stores = await Store.findAll({ order: [['name', 'ASC']] });
	const parts = new Map([...draftParts(draft), ...extra].map((p) => [p.id, p]));
	return {
		regions: regions.map((r) => ({ code: r.code, name: r.name, currency: r.currency })),
		stores: stores.map((s) => ({ id: s.id, name: s.name, regionCode: byId.get(s.regionId) ?? '' })),
		parts: [...parts.values()]
	};
}

/** The parts a stored draft names: each slot's pick and alternates. */
export function draftParts(draft: DraftView): DraftPartRef[] {
	return draft.slots.flatMap((slot) => [slot.pick, ...slot.alternates.map((a) => a.part)]);
}
