/**
 * Reading the review side (docs/architecture.md "Review queue"): the editors' queue of
 * revisions waiting for a decision, every guide by state, one guide's moderation history, and
 * the author's dashboard with the latest decision and what changed since. The decisions are
 * guide-reviews.ts's; the review page of one revision is review-page.ts's.
 */
import { Op } from 'sequelize';
import type { Transaction, WhereOptions } from 'sequelize';
import { revisionDiff } from '$lib/domain/revision-diff';
import type { RevisionDiff } from '$lib/domain/revision-diff';
import type { GuideStateQuery, ReviewQueueQuery } from '$lib/schemas/review';
import { Guide, GuideRevision, Review, User } from '$lib/server/db';
import type {
	DashboardGuide,
	GuideModeration,
	ModeratedGuide,
	QueueItem,
	ReviewLogEntry
} from '$lib/views';
import type { Paged } from './audit';
import { loadRevisionSlots, snapshotOf } from './revision-snapshots';
import { escapeLike, pageWindow } from './list-query';

const PER_PAGE = 20;
const DAY_MS = 86_400_000;

type GuideWithAuthor = Guide & { author?: User | null };
type RevisionWithGuide = GuideRevision & { guide: GuideWithAuthor };

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
	const window = pageWindow(total, query.page, PER_PAGE);
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
			title: r.title,
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

/** The moderation log of a guide, newest first: what authors and editors read. */
export async function reviewLog(
	guideId: number,
	transaction?: Transaction
): Promise<ReviewLogEntry[]> {
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

/** Every guide by state, for editors finding one to unpublish or archive. */
export async function listGuides(query: GuideStateQuery): Promise<Paged<ModeratedGuide>> {
	const where: WhereOptions<Guide> = {};
	if (query.state !== 'all') Object.assign(where, { state: query.state });
	if (query.q) Object.assign(where, { title: { [Op.like]: `%${escapeLike(query.q)}%` } });
	const total = await Guide.count({ where });
	const window = pageWindow(total, query.page, PER_PAGE);
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
			// The author's own list names the working copy, which may differ from the live title.
			title: latest?.title ?? guide.title,
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
