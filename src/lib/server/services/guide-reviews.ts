/**
 * Moderation: the review queue, one revision's review (diff, fit report, power budget,
 * automatic flags), editor decisions, and guide-level unpublish / archive. State changes
 * on guides happen here and nowhere else: authors only draft and submit.
 *
 * One decision per revision. The decision locks the revision row (FOR UPDATE) and stamps
 * it with a conditional UPDATE … WHERE reviewed_at IS NULL, so of two editors deciding at
 * once one wins and the other gets `conflict` with what was decided.
 */
import { Op } from 'sequelize';
import type { Transaction, WhereOptions } from 'sequelize';
import { fitReport, summarize } from '$lib/domain/fit';
import type { Finding, FindingCounts } from '$lib/domain/fit';
import { pairingCautions } from '$lib/domain/pairing-cautions';
import { powerBudget } from '$lib/domain/power';
import type { PowerBudget } from '$lib/domain/power';
import { reviewFlags } from '$lib/domain/review-flags';
import type { ReviewFlag } from '$lib/domain/review-flags';
import { revisionDiff } from '$lib/domain/revision-diff';
import type { RevisionDiff } from '$lib/domain/revision-diff';
import type { Role } from '$lib/domain/types';
import type {
	DecisionInput,
	GuideStateQuery,
	ModerationInput,
	ReviewQueueQuery
} from '$lib/schemas/review';
import { Guide, GuideRevision, Review, Store, User, sequelize } from '$lib/server/db';
import type { ReviewDecision, SlotNote } from '$lib/server/db/models/Review';
import * as audit from './audit';
import { activeRules } from './caution-rules';
import type { Paged } from './audit';
import { sendToAuthor, templates } from './review-mail';
import { notifyForksOfRevision } from './build-notify';
import {
	buildPartsOf,
	emptySnapshot,
	loadRevisionSlots,
	quoteText,
	snapshotOf
} from './revision-snapshots';

export type { SlotNote } from '$lib/server/db/models/Review';

const PER_PAGE = 20;
const DAY_MS = 86_400_000;

export interface Actor {
	id: string;
	role: Role;
}

export interface QueueItem {
	revisionId: number;
	slug: string;
	title: string;
	authorName: string;
	revisionNumber: number;
	kind: 'new' | 'revision';
	/** A revision sent back with "request changes" before, now submitted again. */
	resubmitted: boolean;
	submittedAt: string;
	ageDays: number;
}

type GuideWithAuthor = Guide & { author?: User | null };
type RevisionWithGuide = GuideRevision & { guide: GuideWithAuthor };

function pageWindow(total: number, page: number) {
	const pageCount = Math.max(1, Math.ceil(total / PER_PAGE));
	const current = Math.min(Math.max(1, page), pageCount);
	return { page: current, pageCount, offset: (current - 1) * PER_PAGE };
}

/** Revisions waiting for a decision, oldest first by default (first come, first reviewed). */
export async function listQueue(
	query: ReviewQueueQuery,
	now = new Date()
): Promise<Paged<QueueItem>> {
	const guideWhere: WhereOptions<Guide> = { state: { [Op.notIn]: ['archived', 'declined'] } };
	if (query.kind === 'new') Object.assign(guideWhere, { publishedRevisionId: null });
	if (query.kind === 'revision')
		Object.assign(guideWhere, { publishedRevisionId: { [Op.ne]: null } });
	const authorWhere = query.author
		? {
				[Op.or]: [
					{ name: { [Op.like]: `%${escapeLike(query.author)}%` } },
					{ email: { [Op.like]: `%${escapeLike(query.author)}%` } }
				]
			}
		: undefined;
	const include = [
		{
			model: Guide,
			as: 'guide',
			where: guideWhere,
			required: true,
			include: [
				{
					model: User,
					as: 'author',
					attributes: ['name', 'email'],
					required: Boolean(authorWhere),
					...(authorWhere ? { where: authorWhere } : {})
				}
			]
		}
	];
	const where = { submittedAt: { [Op.ne]: null }, reviewedAt: null };
	const total = await GuideRevision.count({ where, include });
	const window = pageWindow(total, query.page);
	const rows = (await GuideRevision.findAll({
		where,
		include,
		order: [
			['submittedAt', query.sort === 'oldest' ? 'ASC' : 'DESC'],
			['id', 'ASC']
		],
		limit: PER_PAGE,
		offset: window.offset
	})) as RevisionWithGuide[];
	const sentBack = new Set(
		(
			await GuideRevision.findAll({
				where: { guideId: rows.map((r) => r.guide.id), decision: 'request_changes' },
				attributes: ['guideId']
			})
		).map((r) => r.guideId)
	);
	return {
		items: rows.map((r) => ({
			revisionId: r.id,
			slug: r.guide.slug,
			title: r.guide.title,
			authorName: r.guide.author?.name ?? 'Former member',
			revisionNumber: r.number,
			kind: r.guide.publishedRevisionId === null ? 'new' : 'revision',
			resubmitted: sentBack.has(r.guide.id),
			submittedAt: (r.submittedAt as Date).toISOString(),
			ageDays: Math.floor((now.getTime() - (r.submittedAt as Date).getTime()) / DAY_MS)
		})),
		total,
		page: window.page,
		perPage: PER_PAGE,
		pageCount: window.pageCount
	};
}

function escapeLike(value: string): string {
	return value.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export interface ReviewLogEntry {
	decision: ReviewDecision;
	revisionNumber: number | null;
	reviewerName: string;
	note: string | null;
	slotNotes: SlotNote[];
	selfReviewOverride: boolean;
	createdAt: string;
}

export interface ReviewSlot {
	label: string;
	category: string;
	pick: string;
	quantity: number;
	reason: string;
	price: string | null;
	alternates: string[];
}

export interface ReviewPage {
	revisionId: number;
	revisionNumber: number;
	guide: {
		slug: string;
		title: string;
		summary: string;
		state: string;
		authorName: string;
		live: boolean;
		disclosure: string;
		disclosureNote: string | null;
	};
	/** This revision is the one the public sees. */
	isLiveRevision: boolean;
	submittedAt: string | null;
	/** 'pending' while waiting; otherwise what was decided. */
	status: 'pending' | 'draft' | 'approve' | 'request_changes' | 'decline';
	slots: ReviewSlot[];
	/** Against the live revision, or against nothing for a new guide. */
	diff: RevisionDiff;
	/** Against the revision last sent back with notes, when that is not the live one. */
	sinceLastReview: RevisionDiff | null;
	fit: { findings: Finding[]; summary: FindingCounts; slotLabels: Record<string, string> };
	power: PowerBudget;
	flags: ReviewFlag[];
	log: ReviewLogEntry[];
	/** The viewer wrote this guide: an editor may not decide on it; an admin may, recorded as an override. */
	ownGuide: boolean;
	canDecide: boolean;
}

/** Everything an editor needs to decide on one revision, or null when there is no such submitted revision. */
export async function getReview(
	actor: Actor,
	revisionId: number,
	siteHost: string,
	now = new Date()
): Promise<ReviewPage | null> {
	const revision = (await GuideRevision.findByPk(revisionId, {
		include: [
			{
				model: Guide,
				as: 'guide',
				include: [{ model: User, as: 'author', attributes: ['name', 'email'] }]
			}
		]
	})) as RevisionWithGuide | null;
	if (!revision || !revision.submittedAt) return null;
	const guide = revision.guide;
	const live =
		guide.publishedRevisionId && guide.publishedRevisionId !== revision.id
			? await GuideRevision.findByPk(guide.publishedRevisionId)
			: null;
	const sentBack = await GuideRevision.findOne({
		where: { guideId: guide.id, decision: 'request_changes', number: { [Op.lt]: revision.number } },
		order: [['number', 'DESC']]
	});
	const compareSentBack = sentBack && (!live || sentBack.number > live.number) ? sentBack : null;
	const slots = await loadRevisionSlots([
		revision.id,
		...(live ? [live.id] : []),
		...(compareSentBack ? [compareSentBack.id] : [])
	]);
	const own = slots.filter((s) => s.revisionId === revision.id);
	const current = snapshotOf(revision, slots, true);
	const build = buildPartsOf(own);
	// The editors' pairing cautions count here as on the public page.
	const findings = [...fitReport(build), ...pairingCautions(build, await activeRules())];
	const stores = await Store.findAll({ attributes: ['url'] });
	const knownHosts = [
		siteHost.split(':')[0] ?? siteHost,
		...stores.flatMap((s) => (s.url ? [hostOf(s.url)] : [])).filter((h): h is string => h !== null)
	];

	return {
		revisionId: revision.id,
		revisionNumber: revision.number,
		guide: {
			slug: guide.slug,
			title: guide.title,
			summary: guide.summary,
			state: guide.state,
			authorName: guide.author?.name ?? 'Former member',
			live: guide.state === 'published' && guide.publishedRevisionId !== null,
			disclosure: guide.disclosure,
			disclosureNote: guide.disclosureNote
		},
		isLiveRevision: guide.publishedRevisionId === revision.id && guide.state === 'published',
		submittedAt: revision.submittedAt.toISOString(),
		status: revision.reviewedAt ? (revision.decision ?? 'approve') : 'pending',
		slots: own.map((s) => ({
			label: s.label,
			category: s.category,
			pick: `${s.pick.brand} ${s.pick.model}`,
			quantity: s.quantity,
			reason: s.reason,
			price: quoteText(s.priceQuote),
			alternates: s.alternates.map((a) => `${a.part.brand} ${a.part.model}`)
		})),
		diff: revisionDiff(live ? snapshotOf(live, slots, true) : emptySnapshot(), current),
		sinceLastReview: compareSentBack
			? revisionDiff(snapshotOf(compareSentBack, slots, true), current)
			: null,
		fit: {
			findings,
			summary: summarize(findings),
			slotLabels: Object.fromEntries(build.map((b) => [b.key, b.label]))
		},
		power: powerBudget(build),
		flags: reviewFlags({
			disclosure: { kind: guide.disclosure ?? null, note: guide.disclosureNote },
			buildNotesMd: revision.buildNotesMd,
			walkthroughUrl: guide.walkthroughUrl,
			knownHosts,
			quotes: own.flatMap((s) =>
				s.priceQuote
					? [
							{
								slotLabel: s.label,
								observedAt: s.priceQuote.observedAt.toISOString(),
								url: s.priceQuote.url
							}
						]
					: []
			),
			conflicts: findings.filter((f) => f.severity === 'conflict'),
			now
		}),
		log: await reviewLog(guide.id),
		ownGuide: guide.authorId === actor.id,
		canDecide: !revision.reviewedAt && (guide.authorId !== actor.id || actor.role === 'admin')
	};
}

function hostOf(url: string): string | null {
	try {
		return new URL(url).hostname.toLowerCase();
	} catch {
		return null;
	}
}

async function reviewLog(guideId: number, transaction?: Transaction): Promise<ReviewLogEntry[]> {
	const rows = (await Review.findAll({
		where: { guideId },
		include: [
			{ model: User, as: 'reviewer', attributes: ['name'] },
			{ model: GuideRevision, as: 'revision', attributes: ['number'] }
		],
		order: [
			['createdAt', 'DESC'],
			['id', 'DESC']
		],
		transaction
	})) as (Review & { reviewer?: User | null; revision?: GuideRevision | null })[];
	return rows.map((r) => ({
		decision: r.decision,
		revisionNumber: r.revision?.number ?? null,
		reviewerName: r.reviewer?.name ?? 'Former editor',
		note: r.note,
		slotNotes: r.slotNotes ?? [],
		selfReviewOverride: r.selfReviewOverride,
		createdAt: r.createdAt.toISOString()
	}));
}

export type DecideOutcome =
	| { kind: 'ok'; guideState: string; mailed: boolean }
	| { kind: 'not_found' }
	| { kind: 'forbidden'; message: string }
	| { kind: 'conflict'; message: string };

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
		if (input.decision === 'approve') guide.publishedRevisionId = revision.id;
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
		const author = guide.authorId
			? await User.findByPk(guide.authorId, {
					attributes: ['email', 'name', 'disabledAt'],
					transaction
				})
			: null;
		return {
			kind: 'ok',
			guideState: guide.state,
			title: guide.title,
			number: revision.number,
			author: author && !author.disabledAt ? author : null
		} as const;
	});
	if (result.kind !== 'ok') return result;
	const message = templates.reviewDecision({
		name: result.author?.name ?? '',
		title: result.title,
		revision: result.number,
		decision: input.decision,
		note: input.note || null,
		slotNotes: input.slotNotes,
		url: links.guidesUrl
	});
	const mailed = await sendToAuthor(result.author, message, 'review_decision');
	if (input.decision === 'approve')
		await notifyForksOfRevision(revisionId, new URL(links.guidesUrl).origin);
	return { kind: 'ok', guideState: result.guideState, mailed };
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
		const author = guide.authorId
			? await User.findByPk(guide.authorId, {
					attributes: ['email', 'name', 'disabledAt'],
					transaction
				})
			: null;
		return {
			kind: 'ok',
			guideState: guide.state,
			title: guide.title,
			author: author && !author.disabledAt ? author : null
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

export interface ModeratedGuide {
	slug: string;
	title: string;
	state: string;
	authorName: string;
	updatedAt: string;
	pendingRevisionId: number | null;
}

/** Every guide by state, for editors finding one to unpublish or archive. */
export async function listGuides(query: GuideStateQuery): Promise<Paged<ModeratedGuide>> {
	const where: WhereOptions<Guide> = {};
	if (query.state !== 'all') Object.assign(where, { state: query.state });
	if (query.q) Object.assign(where, { title: { [Op.like]: `%${escapeLike(query.q)}%` } });
	const total = await Guide.count({ where });
	const window = pageWindow(total, query.page);
	const rows = (await Guide.findAll({
		where,
		include: [{ model: User, as: 'author', attributes: ['name'] }],
		order: [
			['updatedAt', 'DESC'],
			['id', 'DESC']
		],
		limit: PER_PAGE,
		offset: window.offset
	})) as GuideWithAuthor[];
	const pending = await GuideRevision.findAll({
		where: { guideId: rows.map((g) => g.id), submittedAt: { [Op.ne]: null }, reviewedAt: null },
		attributes: ['id', 'guideId']
	});
	const pendingByGuide = new Map(pending.map((r) => [r.guideId, r.id]));
	return {
		items: rows.map((g) => ({
			slug: g.slug,
			title: g.title,
			state: g.state,
			authorName: g.author?.name ?? 'Former member',
			updatedAt: g.updatedAt.toISOString(),
			pendingRevisionId: pendingByGuide.get(g.id) ?? null
		})),
		total,
		page: window.page,
		perPage: PER_PAGE,
		pageCount: window.pageCount
	};
}

export interface GuideModeration {
	slug: string;
	title: string;
	state: string;
	authorName: string;
	revisions: {
		id: number;
		number: number;
		status: string;
		submittedAt: string | null;
		reviewedAt: string | null;
		live: boolean;
	}[];
	log: ReviewLogEntry[];
}

/** One guide's revisions and decisions, for the editor's moderation page. */
export async function getGuideModeration(slug: string): Promise<GuideModeration | null> {
	const guide = (await Guide.findOne({
		where: { slug },
		include: [{ model: User, as: 'author', attributes: ['name'] }]
	})) as GuideWithAuthor | null;
	if (!guide) return null;
	const revisions = await GuideRevision.findAll({
		where: { guideId: guide.id },
		order: [['number', 'DESC']]
	});
	return {
		slug: guide.slug,
		title: guide.title,
		state: guide.state,
		authorName: guide.author?.name ?? 'Former member',
		revisions: revisions.map((r) => ({
			id: r.id,
			number: r.number,
			status: revisionStatus(r),
			submittedAt: r.submittedAt?.toISOString() ?? null,
			reviewedAt: r.reviewedAt?.toISOString() ?? null,
			live: guide.publishedRevisionId === r.id
		})),
		log: await reviewLog(guide.id)
	};
}

/** A revision's own state, read from its timestamps and decision. */
export function revisionStatus(
	r: Pick<GuideRevision, 'submittedAt' | 'reviewedAt' | 'decision'>
): 'draft' | 'in_review' | 'approve' | 'request_changes' | 'decline' {
	if (!r.submittedAt) return 'draft';
	if (!r.reviewedAt) return 'in_review';
	return r.decision ?? 'approve';
}

export interface DashboardGuide {
	slug: string;
	title: string;
	state: string;
	live: boolean;
	updatedAt: string;
	latestRevision: { number: number; status: string } | null;
	lastDecision: ReviewLogEntry | null;
	/** What the author changed after the last decision on a revision, when anything did. */
	changedSinceDecision: RevisionDiff | null;
	/** Set while an editor has hidden the guide after a content report. */
	hiddenReason: string | null;
}

/** The author's guides with their state, the editor's latest notes and what changed since. */
export async function authorDashboard(authorId: string): Promise<DashboardGuide[]> {
	const guides = await Guide.findAll({ where: { authorId }, order: [['updatedAt', 'DESC']] });
	const result: DashboardGuide[] = [];
	for (const guide of guides) {
		const latest = await GuideRevision.findOne({
			where: { guideId: guide.id },
			order: [['number', 'DESC']]
		});
		const log = await reviewLog(guide.id);
		const lastDecision = log[0] ?? null;
		const decided = await GuideRevision.findOne({
			where: { guideId: guide.id, reviewedAt: { [Op.ne]: null } },
			order: [['number', 'DESC']]
		});
		let changedSinceDecision: RevisionDiff | null = null;
		if (latest && decided && latest.id !== decided.id) {
			const slots = await loadRevisionSlots([latest.id, decided.id]);
			changedSinceDecision = revisionDiff(
				snapshotOf(decided, slots, true),
				snapshotOf(latest, slots, true)
			);
		}
		result.push({
			slug: guide.slug,
			title: guide.title,
			state: guide.state,
			live: guide.state === 'published' && guide.publishedRevisionId !== null,
			updatedAt: guide.updatedAt.toISOString(),
			latestRevision: latest ? { number: latest.number, status: revisionStatus(latest) } : null,
			lastDecision,
			changedSinceDecision,
			hiddenReason: guide.hiddenAt ? (guide.hiddenReason ?? '') : null
		});
	}
	return result;
}
