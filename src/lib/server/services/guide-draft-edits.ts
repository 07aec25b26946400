/**
 * Authoring guides, changing: create a guide, save its working copy with optimistic locking,
 * and submit it for review (reading the working copy is guide-drafts.ts's).
 *
 * Revisions and states:
 * - The working copy is the guide's latest revision while its `submittedAt` is null.
 * - Submitting stamps `submittedAt`: that revision is frozen for good. The next save creates
 *   revision N+1 from the input; only frame/thermal results the input leaves out (older API
 *   clients) are copied from the frozen revision, as new rows (guide-draft-results.ts).
 * - The guide's details (title, summary, budget, base region, tags, disclosure, walkthrough
 *   link) and the prices typed into slots are the revision's: saving writes them to the
 *   working copy and price proposals (guide-price-proposals.ts), never to the guide row or
 *   to quotes. The guide row's details are the published revision's copy, written only by
 *   an editor's approval (guide-reviews.ts), so a saved draft changes nothing public.
 * - `guides.state` is the guide's public lifecycle. A guide with a published revision stays
 *   'published' (its `publishedRevisionId` stays live) while a newer revision is drafted or
 *   waits for review. A guide never published goes draft → in_review; only an editor's
 *   decision publishes (guide-reviews.ts).
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { decimalMarkOf, parseAmount } from '$lib/domain/money';
import { CATEGORY_LABELS } from '$lib/domain/types';
import { joinBuildNotes, type CreateGuideInput, type DraftInput } from '$lib/schemas/guide-editor';
import {
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Region,
	SlotAlternate,
	Store,
	User,
	sequelize
} from '$lib/server/db';
import { detailsOf } from '$lib/server/db/models/GuideRevision';
import { renderMarkdown } from '$lib/server/markdown';
import type { DraftView } from '$lib/views';
import { checkGallery, writeGallery } from './gallery';
import { copyResults, replaceFrames, replaceThermals } from './guide-draft-results';
import { clearProposals, proposePrice } from './guide-price-proposals';
import { latestRevision, ownGuide, viewOf } from './guide-drafts';
import type { Invalid, Issues, NotFound, Stale } from '$lib/schemas/issues';
import { afterSubmit } from './notice-triggers';
import { sendToAuthor, submittedMail } from './review-mail';

export type CreateOutcome = { kind: 'created'; slug: string; version: number } | Invalid;
export type SaveOutcome =
	{ kind: 'saved'; draft: DraftView } | Stale<DraftView> | Invalid | NotFound;
export type SubmitOutcome =
	{ kind: 'submitted'; draft: DraftView } | Stale<DraftView> | Invalid | NotFound;

/**
 * An amount the author typed, in the base region's currency and read the way that region
 * writes amounts ("129,90" where it writes the decimal comma; domain/money.ts parseAmount).
 */
function amountIn(text: string, region: Region) {
	return parseAmount(text, region.currency, decimalMarkOf(region.code));
}

function slugify(title: string): string {
	const base = title
		.toLowerCase()
		.normalize('NFKD')
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 120)
		.replace(/-+$/, '');
	return base || 'guide';
}

async function uniqueSlug(title: string, transaction: Transaction): Promise<string> {
	const base = slugify(title);
	const taken = new Set(
		(
			await Guide.findAll({
				where: { slug: { [Op.like]: `${base}%` } },
				attributes: ['slug'],
				transaction
			})
		).map((g) => g.slug)
	);
	if (!taken.has(base)) return base;
	for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}

/** A new guide with an empty draft revision 1, owned by `authorId`. */
export async function createGuide(
	authorId: string,
	input: CreateGuideInput
): Promise<CreateOutcome> {
	const region = await Region.findOne({ where: { code: input.baseRegion } });
	if (!region)
		return { kind: 'invalid', issues: { baseRegion: ['Choose a region from the list.'] } };
	const budget = amountIn(input.targetBudget, region);
	if (!budget.ok) return { kind: 'invalid', issues: { targetBudget: [budget.message] } };
	return sequelize.transaction(async (transaction) => {
		const guide = await Guide.create(
			{
				slug: await uniqueSlug(input.title, transaction),
				authorId,
				title: input.title,
				summary: input.summary,
				targetBudgetMinor: budget.amountMinor,
				baseRegionId: region.id,
				tags: input.tags,
				disclosure: input.disclosure,
				disclosureNote: input.disclosureNote,
				walkthroughUrl: input.walkthroughUrl,
				publishedRevisionId: null
			},
			{ transaction }
		);
		// The guide row needs details from the start (it is not public before a first
		// approval, which overwrites them with the approved revision's).
		await GuideRevision.create(
			{
				guideId: guide.id,
				number: 1,
				...detailsOf(guide),
				buildNotesMd: '',
				buildNotesHtml: '',
				submittedAt: null,
				reviewedAt: null,
				publishedAt: null,
				reviewerId: null,
				reviewNote: null
			},
			{ transaction }
		);
		return { kind: 'created', slug: guide.slug, version: guide.version };
	});
}

/** Catalog and store references the schema cannot check: parts exist in the slot's category, stores sit in the base region. */
async function checkReferences(input: DraftInput, region: Region): Promise<Issues> {
	const issues: Issues = {};
	const partIds = input.slots.flatMap((s) => [s.pickPartId, ...s.alternates.map((a) => a.partId)]);
	const parts = new Map((await Part.findAll({ where: { id: partIds } })).map((p) => [p.id, p]));
	const storeIds = input.slots.flatMap((s) => (s.priceQuote ? [s.priceQuote.storeId] : []));
	const stores = new Map((await Store.findAll({ where: { id: storeIds } })).map((s) => [s.id, s]));
	const add = (key: string, message: string) => (issues[key] ??= []).push(message);
	input.slots.forEach((slot, i) => {
		const wrong = (id: number) => {
			const part = parts.get(id);
			if (!part) return 'No such part in the catalog.';
			return part.category === slot.category
				? null
				: `That part is not a ${CATEGORY_LABELS[slot.category]}.`;
		};
		const pickProblem = wrong(slot.pickPartId);
		if (pickProblem) add(`slots.${i}.pickPartId`, pickProblem);
		slot.alternates.forEach((alt, j) => {
			const problem = wrong(alt.partId);
			if (problem) add(`slots.${i}.alternates.${j}.partId`, problem);
			else if (alt.partId === slot.pickPartId)
				add(`slots.${i}.alternates.${j}.partId`, 'An alternate must differ from the pick.');
		});
		if (slot.priceQuote) {
			const store = stores.get(slot.priceQuote.storeId);
			if (!store || store.regionId !== region.id)
				add(
					`slots.${i}.priceQuote.storeId`,
					`Choose a store in the guide's base region (${region.name}).`
				);
			const amount = amountIn(slot.priceQuote.amount, region);
			if (!amount.ok) add(`slots.${i}.priceQuote.amount`, amount.message);
		}
	});
	return issues;
}

/**
 * Replaces the working copy (metadata, build notes, slots, alternates) in one transaction.
 * The guide row is updated first with `WHERE id AND version = expectedVersion`: no affected
 * row means someone saved in between, and the stored copy comes back as `current`.
 */
export async function saveDraft(
	authorId: string,
	slug: string,
	input: DraftInput,
	expectedVersion: number
): Promise<SaveOutcome> {
	const guide = await ownGuide(authorId, slug);
	if (!guide) return { kind: 'not_found' };
	const closed = closedReason(guide);
	if (closed) return { kind: 'invalid', issues: { _form: [closed] } };
	const region = await Region.findOne({ where: { code: input.baseRegion } });
	if (!region)
		return { kind: 'invalid', issues: { baseRegion: ['Choose a region from the list.'] } };
	const budget = amountIn(input.targetBudget, region);
	const issues = await checkReferences(input, region);
	if (input.gallery) Object.assign(issues, await checkGallery(guide.id, input.gallery));
	if (!budget.ok) issues.targetBudget = [budget.message];
	if (!budget.ok || Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	const buildNotesMd = joinBuildNotes(input.buildNotes);
	const buildNotesHtml = renderMarkdown(buildNotesMd);
	const details = {
		title: input.title,
		summary: input.summary,
		targetBudgetMinor: budget.amountMinor,
		baseRegionId: region.id,
		tags: input.tags,
		disclosure: input.disclosure,
		disclosureNote: input.disclosureNote,
		walkthroughUrl: input.walkthroughUrl
	};

	return sequelize.transaction(async (transaction): Promise<SaveOutcome> => {
		// Only the version moves on the guide row: its details are the live copy (see above).
		const [affected] = await Guide.update(
			{ version: expectedVersion + 1 },
			{ where: { id: guide.id, version: expectedVersion }, transaction }
		);
		if (affected !== 1) {
			const current = await viewOf(guide, transaction);
			return { kind: 'conflict', current };
		}

		let revision = await latestRevision(guide.id, transaction);
		if (!revision || revision.submittedAt) {
			// The latest revision is frozen (submitted or published): the save starts N+1.
			const frozen = revision;
			revision = await GuideRevision.create(
				{
					guideId: guide.id,
					number: (frozen?.number ?? 0) + 1,
					...details,
					buildNotesMd,
					buildNotesHtml,
					submittedAt: null,
					reviewedAt: null,
					publishedAt: null,
					reviewerId: null,
					reviewNote: null
				},
				{ transaction }
			);
			// Results the input leaves out are measurements of the same build: N+1 starts with
			// copies of the frozen revision's rows (new rows; the frozen ones stay untouched).
			if (frozen)
				await copyResults(
					frozen.id,
					revision.id,
					{ frames: input.frames === undefined, thermals: input.thermals === undefined },
					transaction
				);
			// The gallery is carried over the same way (a copy of the frozen rows unless sent).
			await writeGallery(revision.id, input.gallery, frozen?.id ?? null, transaction);
		} else {
			await writeGallery(revision.id, input.gallery, null, transaction);
			await revision.update({ ...details, buildNotesMd, buildNotesHtml }, { transaction });
			// Alternates go with their slots (ON DELETE CASCADE).
			await GuideSlot.destroy({ where: { revisionId: revision.id }, transaction });
			await clearProposals(revision.id, transaction);
		}

		for (const [i, slot] of input.slots.entries()) {
			// A typed price is a proposal of this revision; it becomes a quote on approval.
			if (slot.priceQuote)
				await proposePrice(
					revision.id,
					i + 1,
					slot.pickPartId,
					{
						storeId: slot.priceQuote.storeId,
						amountMinor: proposedMinor(slot.priceQuote.amount, region),
						observedAt: slot.priceQuote.observedAt
					},
					region,
					transaction
				);
			const row = await GuideSlot.create(
				{
					revisionId: revision.id,
					// A slot carried over keeps its key (a new revision copies it); a new slot gets one.
					...(slot.slotKey !== null ? { slotKey: slot.slotKey } : {}),
					category: slot.category,
					label: slot.label,
					position: i + 1,
					quantity: slot.quantity,
					pickPartId: slot.pickPartId,
					reason: slot.reason,
					priceQuoteId: null
				},
				{ transaction }
			);
			if (slot.alternates.length > 0) {
				await SlotAlternate.bulkCreate(
					slot.alternates.map((a, j) => ({
						slotId: row.id,
						partId: a.partId,
						rank: j + 1,
						reasonTag: a.reasonTag,
						note: a.note
					})),
					{ transaction }
				);
			}
		}
		if (input.frames) await replaceFrames(revision.id, input.frames, transaction);
		if (input.thermals) await replaceThermals(revision.id, input.thermals, transaction);
		const fresh = await Guide.findByPk(guide.id, { transaction });
		return { kind: 'saved', draft: await viewOf(fresh ?? guide, transaction) };
	});
}

/** A typed price in minor units; checkReferences has refused amounts that do not parse. */
function proposedMinor(amount: string, region: Region): number {
	const parsed = amountIn(amount, region);
	return parsed.ok ? parsed.amountMinor : 0;
}

/** Freezes the working copy for review (submittedAt); guarded by the same version check. */
export async function submit(
	authorId: string,
	slug: string,
	expectedVersion: number,
	links?: { guidesUrl: string },
	options: { major?: boolean } = {}
): Promise<SubmitOutcome> {
	const guide = await ownGuide(authorId, slug);
	if (!guide) return { kind: 'not_found' };
	const closed = closedReason(guide);
	if (closed) return { kind: 'invalid', issues: { _form: [closed] } };
	const outcome = await sequelize.transaction(async (transaction): Promise<SubmitOutcome> => {
		const revision = await latestRevision(guide.id, transaction);
		if (!revision || revision.submittedAt)
			return {
				kind: 'invalid',
				issues: { _form: ['There is no draft to submit: save a change first.'] }
			};
		const slotCount = await GuideSlot.count({ where: { revisionId: revision.id }, transaction });
		if (slotCount === 0)
			return {
				kind: 'invalid',
				issues: { slots: ['Add at least one slot and save before submitting.'] }
			};
		// A live guide stays live while the new revision waits; anything else waits in review.
		// Only an editor's decision publishes (services/guide-reviews).
		const state = guide.state === 'published' ? 'published' : 'in_review';
		const [affected] = await Guide.update(
			{ state, version: expectedVersion + 1 },
			{ where: { id: guide.id, version: expectedVersion }, transaction }
		);
		if (affected !== 1) return { kind: 'conflict', current: await viewOf(guide, transaction) };
		// major: the author asks for the approved revision to be mailable like a new guide.
		await revision.update(
			{ submittedAt: new Date(), major: options.major ?? false },
			{ transaction }
		);
		const fresh = await Guide.findByPk(guide.id, { transaction });
		return { kind: 'submitted', draft: await viewOf(fresh ?? guide, transaction) };
	});
	if (outcome.kind === 'submitted' && links) {
		const author = await User.findByPk(authorId, { attributes: ['email', 'name'] });
		if (author)
			await sendToAuthor(
				author,
				submittedMail(author, outcome.draft.title, outcome.draft.revisionNumber, links.guidesUrl),
				'revision_submitted'
			);
		await afterSubmit(slug, outcome.draft.revisionNumber, new URL(links.guidesUrl).origin);
	}
	return outcome;
}

/** Declined and archived guides are closed: the author can read them but not edit or resubmit. */
function closedReason(guide: Guide): string | null {
	if (guide.state === 'archived')
		return 'This guide was archived by an editor and can no longer be edited.';
	if (guide.state === 'declined')
		return 'This guide was declined by an editor and can no longer be edited. Start a new guide instead.';
	return null;
}
