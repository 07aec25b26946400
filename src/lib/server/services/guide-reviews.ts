/**
 * Moderation decisions (DEVELOPERS.md "Guide states and review"): an editor's decision on a
 * revision, and guide-level unpublish / archive. State changes on guides happen here and
 * nowhere else: authors only draft and submit. Reading the queue, the review page and the
 * author's dashboard is review-queue.ts's and review-page.ts's.
 *
 * One decision per revision. The decision locks the revision row (FOR UPDATE) and stamps
 * it with a conditional UPDATE … WHERE reviewed_at IS NULL, so of two editors deciding at
 * once one wins and the other gets `conflict` with what was decided.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { Role } from '$lib/domain/types';
import type { DecisionInput, ModerationInput } from '$lib/schemas/review';
import { Guide, GuideRevision, Review, User, sequelize } from '$lib/server/db';
import { detailsOf } from '$lib/server/db/models/GuideRevision';
import type { ReviewDecision } from '$lib/server/db/models/Review';
import * as audit from './audit';
import { notifyForksOfRevision } from './build-notify';
import { adoptProposals } from './guide-price-proposals';
import { afterDecision } from './notice-triggers';
import { emailWanted } from './notices';
import { sendToAuthor, templates } from './review-mail';
import type { Conflict, NotFound } from '$lib/schemas/issues';
import * as guidePrices from './guide-prices';

export type { SlotNote } from '$lib/server/db/models/Review';

export interface Actor {
	id: string;
	role: Role;
}

export type DecideOutcome =
	| { kind: 'ok'; guideState: string; mailed: boolean }
	| NotFound
	| { kind: 'forbidden'; message: string }
	| Conflict;

const DECISION_WORDS: Record<ReviewDecision, string> = {
	approve: 'approved',
	request_changes: 'sent back with changes requested',
	decline: 'declined',
	unpublish: 'unpublished',
	archive: 'archived'
};

/** The guide's state after a decision on one of its revisions. A live guide stays live unless approved anew. */
function stateAfter(decision: DecisionInput['decision'], current: string): Guide['state'] {
	if (decision === 'approve') return 'published';
	if (current === 'published') return 'published';
	return decision === 'request_changes' ? 'changes_requested' : 'declined';
}

export async function decide(
	actor: Actor,
	revisionId: number,
	input: DecisionInput,
	links: { guidesUrl: string }
): Promise<DecideOutcome> {
	let adoptedQuoteIds: number[] = [];
	const result = await sequelize.transaction(async (transaction) => {
		// Lock order: revision, then guide (unpublish/archive lock only the guide, so no cycle).
		const revision = await GuideRevision.findByPk(revisionId, {
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!revision || !revision.submittedAt) return { kind: 'not_found' } as const;
		const guide = await Guide.findByPk(revision.guideId, {
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!guide) return { kind: 'not_found' } as const;
		if (revision.reviewedAt)
			return { kind: 'conflict', message: await alreadyDecided(revision, transaction) } as const;
		if (guide.state === 'archived')
			return {
				kind: 'conflict',
				message: 'This guide was archived meanwhile; nothing can be decided on it.'
			} as const;
		const own = guide.authorId === actor.id;
		if (own && actor.role !== 'admin') {
			return {
				kind: 'forbidden',
				message: 'You wrote this guide, so another editor must review it.'
			} as const;
		}

		const now = new Date();
		const [affected] = await GuideRevision.update(
			{
				reviewedAt: now,
				reviewerId: actor.id,
				reviewNote: input.note || null,
				decision: input.decision,
				publishedAt: input.decision === 'approve' ? now : null
			},
			{ where: { id: revision.id, reviewedAt: null }, transaction }
		);
		if (affected !== 1)
			return { kind: 'conflict', message: await alreadyDecided(revision, transaction) } as const;
		const before = { state: guide.state, publishedRevisionId: guide.publishedRevisionId };
		guide.state = stateAfter(input.decision, guide.state);
		if (input.decision === 'approve') {
			// Approval is the one moment public details and prices change (issue 12, items 1
			// and 2): the guide row takes the revision's details as its published copy, and
			// the revision's proposed prices become quotes, all in this transaction.
			guide.publishedRevisionId = revision.id;
			guide.set(detailsOf(revision));
			adoptedQuoteIds = await adoptProposals(revision.id, transaction);
		}
		await guide.save({ transaction });
		await Review.create(
			{
				guideId: guide.id,
				revisionId: revision.id,
				reviewerId: actor.id,
				decision: input.decision,
				note: input.note || null,
				slotNotes: input.slotNotes,
				selfReviewOverride: own
			},
			{ transaction }
		);
		const action = {
			approve: 'guide_revision.approved',
			request_changes: 'guide_revision.changes_requested',
			decline: 'guide_revision.declined'
		}[input.decision];
		await audit.record(
			{
				actorId: actor.id,
				action,
				subjectType: 'guide_revision',
				subjectId: revision.id,
				before: { ...before, revision: revision.number, revisionState: 'in_review' },
				after: {
					state: guide.state,
					publishedRevisionId: guide.publishedRevisionId,
					revision: revision.number,
					decision: input.decision,
					note: input.note || null,
					slotNotes: input.slotNotes.length,
					selfReviewOverride: own
				}
			},
			transaction
		);
		if (own) {
			await audit.record(
				{
					actorId: actor.id,
					action: 'review.self_review_override',
					subjectType: 'guide',
					subjectId: guide.id,
					before: null,
					after: { slug: guide.slug, revision: revision.number, decision: input.decision }
				},
				transaction
			);
		}
		const author = await authorToMail(guide, transaction);
		return {
			kind: 'ok',
			guideState: guide.state,
			title: revision.title,
			number: revision.number,
			author
		} as const;
	});
	if (result.kind !== 'ok') return result;
	// Lists show the new revision's stored figures from now on (after commit: pricing reads
	// through the pool and must see the published revision).
	// The adopted quotes are public prices now: every published guide with those parts moves.
	if (input.decision === 'approve') {
		await guidePrices.refreshRevisions([revisionId]);
		if (adoptedQuoteIds.length > 0) await guidePrices.refreshForQuotes(adoptedQuoteIds);
	}
	const message = templates.reviewDecision({
		name: result.author?.name ?? '',
		title: result.title,
		revision: result.number,
		decision: input.decision,
		note: input.note || null,
		slotNotes: input.slotNotes,
		url: links.guidesUrl
	});
	// The author may have turned this e-mail off on the account page (services/notices.ts).
	const wanted = result.author && (await emailWanted([result.author.id], 'revision_decided')).size;
	const mailed = wanted ? await sendToAuthor(result.author, message, 'review_decision') : false;
	const origin = new URL(links.guidesUrl).origin;
	if (input.decision === 'approve') await notifyForksOfRevision(revisionId, origin);
	await afterDecision(revisionId, input.decision, origin);
	return { kind: 'ok', guideState: result.guideState, mailed };
}

/** The guide's author, to be told about a decision after it commits; null when gone or disabled. */
async function authorToMail(guide: Guide, transaction: Transaction): Promise<User | null> {
	if (!guide.authorId) return null;
	const author = await User.findByPk(guide.authorId, {
		attributes: ['id', 'email', 'name', 'disabledAt'],
		transaction
	});
	return author && !author.disabledAt ? author : null;
}

async function alreadyDecided(revision: GuideRevision, transaction: Transaction): Promise<string> {
	const fresh = (await GuideRevision.findByPk(revision.id, {
		include: [{ model: User, as: 'reviewer', attributes: ['name'] }],
		transaction
	})) as (GuideRevision & { reviewer?: User | null }) | null;
	const who = fresh?.reviewer?.name ?? 'another editor';
	const what = DECISION_WORDS[(fresh?.decision ?? 'approve') as ReviewDecision];
	const when = fresh?.reviewedAt
		? ` at ${fresh.reviewedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`
		: '';
	return `Revision ${revision.number} was already ${what} by ${who}${when}. Nothing was changed.`;
}

export type ModerateOutcome = DecideOutcome;

/**
 * Guide-level actions. Unpublish takes a live guide off the site and sends it back to the
 * author (it waits in the queue again if a newer revision is pending); archive retires it
 * for good: not public, not editable, out of the queue.
 */
export async function moderate(
	actor: Actor,
	slug: string,
	input: ModerationInput,
	links: { guidesUrl: string }
): Promise<ModerateOutcome> {
	const result = await sequelize.transaction(async (transaction) => {
		const guide = await Guide.findOne({
			where: { slug },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!guide) return { kind: 'not_found' } as const;
		if (input.action === 'unpublish' && guide.state !== 'published') {
			return {
				kind: 'conflict',
				message: 'Only a published guide can be unpublished; this one is not public.'
			} as const;
		}
		if (guide.state === 'archived')
			return { kind: 'conflict', message: 'This guide is already archived.' } as const;
		const pending = await GuideRevision.count({
			where: { guideId: guide.id, submittedAt: { [Op.ne]: null }, reviewedAt: null },
			transaction
		});
		const before = { state: guide.state };
		guide.state =
			input.action === 'archive' ? 'archived' : pending > 0 ? 'in_review' : 'changes_requested';
		await guide.save({ transaction });
		await Review.create(
			{
				guideId: guide.id,
				revisionId: null,
				reviewerId: actor.id,
				decision: input.action,
				note: input.reason,
				slotNotes: []
			},
			{ transaction }
		);
		await audit.record(
			{
				actorId: actor.id,
				action: input.action === 'archive' ? 'guide.archived' : 'guide.unpublished',
				subjectType: 'guide',
				subjectId: guide.id,
				before,
				after: { state: guide.state, reason: input.reason }
			},
			transaction
		);
		const author = await authorToMail(guide, transaction);
		return {
			kind: 'ok',
			guideState: guide.state,
			title: guide.title,
			author
		} as const;
	});
	if (result.kind !== 'ok') return result;
	const message = templates.reviewDecision({
		name: result.author?.name ?? '',
		title: result.title,
		revision: null,
		decision: input.action,
		note: input.reason,
		url: links.guidesUrl
	});
	return {
		kind: 'ok',
		guideState: result.guideState,
		mailed: await sendToAuthor(result.author, message, 'guide_moderated')
	};
}
