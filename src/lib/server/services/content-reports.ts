/**
 * Content reports: signed-in people report a guide, build or photo with a reason; editors
 * dismiss the reports, hide the content (its owner still sees it, with the reason) or
 * restore it. The only module that reads or writes content reports or the hidden columns
 * of guides and builds. Every decision writes its audit event in the same transaction.
 *
 * Subjects: a small registry maps each subject type to a handler that finds, describes,
 * hides and restores that kind of content. 'guide' and 'build' have handlers (a build's
 * hidden columns are written here too); 'photo' is a valid subject type (schema, table,
 * audit) but is refused with a clear message until that area exists. Adding one means writing its SubjectHandler and
 * putting it into SUBJECTS; nothing else here changes.
 *
 * Concurrency: one open report per reporter and subject is guaranteed by a unique index
 * (see the migration); decisions lock the item's row first and then make conditional updates (`WHERE state = 'open'`,
 * `WHERE hidden_at IS NULL`), so of two editors deciding at once one wins and the other is
 * told the reports were already decided.
 */
import { timingSafeEqual } from 'node:crypto';
import { Op, QueryTypes, UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { ReportCategory, ReportState, ReportSubjectType } from '$lib/domain/content-reports';
import { Build, ContentReport, Guide, User, sequelize } from '$lib/server/db';
import * as audit from './audit';
import type { Paged } from './audit';
import { wholeSecondNow } from './users';
import type { Outcome } from './users';

/** Subject groups per page in the editors' queue. */
export const GROUPS_PER_PAGE = 20;
/** Reports shown per group (the count says how many there are in all). */
const REPORTS_SHOWN_PER_GROUP = 10;

/** What the queue and pages show about a reported item. */
export interface SubjectSummary {
	type: ReportSubjectType;
	id: string;
	title: string;
	/** Where an editor opens it (the owner and editors see hidden content there). */
	url: string;
	ownerName: string | null;
	hidden: { reason: string; at: string } | null;
}

export interface ReportView {
	id: number;
	category: ReportCategory;
	detail: string;
	state: ReportState;
	reporter: { name: string | null; email: string };
	/** ISO 8601, UTC. */
	createdAt: string;
	decidedAt: string | null;
	decidedBy: string | null;
}

/** One reported item with its reports (newest first, at most 10) and how many in all. */
export interface ReportGroup {
	subject: SubjectSummary;
	reportCount: number;
	latestAt: string;
	reports: ReportView[];
}

interface SubjectHandler {
	/**
	 * Locks the item's row for the rest of the transaction (false when it does not exist).
	 * Every decision takes this lock first, then the report rows: one lock order, so two
	 * editors deciding the same item queue instead of deadlocking on the reports' index gaps.
	 */
	lock(id: string, transaction: Transaction): Promise<boolean>;
	/**
	 * The item a reader may report, looked up by the key in its public URL (a guide's slug, a
	 * build's id). `reader` is who reports and what else their URL carried (an unlisted build's
	 * link token): what they may not see is not found.
	 */
	findReportable(
		key: string,
		transaction: Transaction,
		reader: { id: string; shareToken?: string }
	): Promise<{ id: string; ownerId: string | null } | null>;
	summaries(ids: string[]): Promise<Map<string, SubjectSummary>>;
	/** Hides the item if it is visible: 'ok', 'already' (hidden by someone else) or 'not_found'. */
	hide(
		id: string,
		reason: string,
		actorId: string,
		transaction: Transaction
	): Promise<'ok' | 'already' | 'not_found'>;
	/** Shows the item again; returns the reason it had been hidden for. */
	restore(
		id: string,
		transaction: Transaction
	): Promise<
		{ kind: 'ok'; reason: string | null } | { kind: 'not_hidden' } | { kind: 'not_found' }
	>;
}

const guideSubject: SubjectHandler = {
	async lock(id, transaction) {
		const guide = await Guide.findByPk(Number(id), {
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		return guide !== null;
	},

	async findReportable(slug, transaction) {
		// Only what the public can see is reportable: a published, visible guide.
		const guide = await Guide.findOne({
			where: { slug, state: 'published', publishedRevisionId: { [Op.ne]: null }, hiddenAt: null },
			attributes: ['id', 'authorId'],
			transaction
		});
		return guide ? { id: String(guide.id), ownerId: guide.authorId ?? null } : null;
	},

	async summaries(ids) {
		const rows = (await Guide.findAll({
			where: { id: ids.map(Number) },
			attributes: ['id', 'slug', 'title', 'hiddenAt', 'hiddenReason'],
			include: [{ model: User, as: 'author', attributes: ['name'] }]
		})) as (Guide & { author?: User | null })[];
		return new Map(
			rows.map((g) => [
				String(g.id),
				{
					type: 'guide' as const,
					id: String(g.id),
					title: g.title,
					url: `/guides/${g.slug}`,
					ownerName: g.author?.name ?? null,
					hidden: g.hiddenAt ? { reason: g.hiddenReason ?? '', at: g.hiddenAt.toISOString() } : null
				}
			])
		);
	},

	async hide(id, reason, actorId, transaction) {
		const [changed] = await Guide.update(
			{ hiddenAt: wholeSecondNow(), hiddenReason: reason, hiddenById: actorId },
			{ where: { id: Number(id), hiddenAt: null }, transaction, silent: true }
		);
		if (changed === 1) return 'ok';
		return (await Guide.count({ where: { id: Number(id) }, transaction })) > 0
			? 'already'
			: 'not_found';
	},

	async restore(id, transaction) {
		const guide = await Guide.findByPk(Number(id), {
			attributes: ['id', 'hiddenAt', 'hiddenReason'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!guide) return { kind: 'not_found' };
		const [changed] = await Guide.update(
			{ hiddenAt: null, hiddenReason: null, hiddenById: null },
			{ where: { id: guide.id, hiddenAt: { [Op.ne]: null } }, transaction, silent: true }
		);
		return changed === 1
			? { kind: 'ok', reason: guide.hiddenReason ?? null }
			: { kind: 'not_hidden' };
	}
};

function sameToken(stored: string, given: string | undefined): boolean {
	if (!given) return false;
	const a = Buffer.from(stored);
	const b = Buffer.from(given);
	return a.length === b.length && timingSafeEqual(a, b);
}

/**
 * Builds (services/builds.ts): reportable by whoever may read them — a public build, an
 * unlisted one with its link token — and never hidden. A private build of someone else is
 * not found (its existence is not revealed). The owner is found, so `report` refuses their
 * own build like an own guide. Editors open a reported or hidden build whatever its
 * visibility (builds.ts getBuild, editor access), so the queue links unlisted ones with
 * their token only for convenience.
 */
const buildSubject: SubjectHandler = {
	async lock(id, transaction) {
		const build = await Build.findByPk(Number(id), {
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		return build !== null;
	},

	async findReportable(key, transaction, reader) {
		if (!/^[1-9][0-9]{0,9}$/.test(key)) return null;
		const build = await Build.findOne({
			where: { id: Number(key), hiddenAt: null },
			attributes: ['id', 'ownerId', 'visibility', 'shareToken'],
			transaction
		});
		if (!build) return null;
		const mayRead =
			build.ownerId === reader.id ||
			build.visibility === 'public' ||
			(build.visibility === 'unlisted' && sameToken(build.shareToken, reader.shareToken));
		return mayRead ? { id: String(build.id), ownerId: build.ownerId } : null;
	},

	async summaries(ids) {
		const rows = (await Build.findAll({
			where: { id: ids.map(Number) },
			attributes: ['id', 'title', 'visibility', 'shareToken', 'hiddenAt', 'hiddenReason'],
			include: [{ model: User, as: 'owner', attributes: ['name'] }]
		})) as (Build & { owner?: User | null })[];
		return new Map(
			rows.map((b) => [
				String(b.id),
				{
					type: 'build' as const,
					id: String(b.id),
					title: b.title,
					url:
						b.visibility === 'unlisted'
							? `/builds/${b.id}?key=${encodeURIComponent(b.shareToken)}`
							: `/builds/${b.id}`,
					ownerName: b.owner?.name ?? null,
					hidden: b.hiddenAt ? { reason: b.hiddenReason ?? '', at: b.hiddenAt.toISOString() } : null
				}
			])
		);
	},

	async hide(id, reason, actorId, transaction) {
		// silent: hiding is not the owner's change (updatedAt and version stay as they were).
		const [changed] = await Build.update(
			{ hiddenAt: wholeSecondNow(), hiddenReason: reason, hiddenById: actorId },
			{ where: { id: Number(id), hiddenAt: null }, transaction, silent: true }
		);
		if (changed === 1) return 'ok';
		return (await Build.count({ where: { id: Number(id) }, transaction })) > 0
			? 'already'
			: 'not_found';
	},

	async restore(id, transaction) {
		const build = await Build.findByPk(Number(id), {
			attributes: ['id', 'hiddenAt', 'hiddenReason'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!build) return { kind: 'not_found' };
		const [changed] = await Build.update(
			{ hiddenAt: null, hiddenReason: null, hiddenById: null },
			{ where: { id: build.id, hiddenAt: { [Op.ne]: null } }, transaction, silent: true }
		);
		return changed === 1
			? { kind: 'ok', reason: build.hiddenReason ?? null }
			: { kind: 'not_hidden' };
	}
};

/** The registry: null marks a subject type the schema knows but the product does not have yet. */
const SUBJECTS: Record<ReportSubjectType, SubjectHandler | null> = {
	guide: guideSubject,
	build: buildSubject,
	photo: null
};

/** Whether an item has a report no editor has decided yet (editors may open it to decide). */
export async function hasOpenReport(
	subjectType: ReportSubjectType,
	subjectId: string
): Promise<boolean> {
	return (await ContentReport.count({ where: { subjectType, subjectId, state: 'open' } })) > 0;
}

function handlerFor(
	type: ReportSubjectType
): SubjectHandler | { kind: 'conflict'; message: string } {
	return (
		SUBJECTS[type] ?? {
			kind: 'conflict',
			message: `Reports on ${type}s are not open yet: that kind of content does not exist on Slotwise so far.`
		}
	);
}

/**
 * Files a report by `reporterId` on the item of `subjectType` with public key `key` (a
 * guide's slug, a build's id; `access.shareToken` is an unlisted build's link token). A
 * second report while the reporter's first is still open is answered with `created: false`
 * and changes nothing.
 */
export async function report(
	reporterId: string,
	subjectType: ReportSubjectType,
	key: string,
	input: { category: ReportCategory; detail: string },
	access: { shareToken?: string } = {}
): Promise<Outcome<{ created: boolean; reportId: number }>> {
	const handler = handlerFor(subjectType);
	if ('kind' in handler) return handler;
	let subjectId: string | null = null;
	try {
		return await sequelize.transaction(async (transaction) => {
			const subject = await handler.findReportable(key, transaction, {
				id: reporterId,
				shareToken: access.shareToken
			});
			if (!subject) return { kind: 'not_found' } as const;
			subjectId = subject.id;
			if (subject.ownerId === reporterId) {
				return {
					kind: 'conflict',
					message: 'This is your own content: edit it instead of reporting it.'
				} as const;
			}
			const open = await ContentReport.findOne({
				where: { reporterId, subjectType, subjectId: subject.id, state: 'open' },
				attributes: ['id'],
				transaction
			});
			if (open) return { kind: 'ok', created: false, reportId: open.id } as const;
			const row = await ContentReport.create(
				{
					reporterId,
					subjectType,
					subjectId: subject.id,
					category: input.category,
					detail: input.detail
				},
				{ transaction }
			);
			return { kind: 'ok', created: true, reportId: row.id } as const;
		});
	} catch (error) {
		// Two submits at the same moment: the unique index lets one in; the other is the repeat.
		if (error instanceof UniqueConstraintError && subjectId !== null) {
			const open = await ContentReport.findOne({
				where: { reporterId, subjectType, subjectId, state: 'open' }
			});
			if (open) return { kind: 'ok', created: false, reportId: open.id };
		}
		throw error;
	}
}

/**
 * The editors' queue: reported items, one group per item with its report count, newest
 * report first. `state: 'open'` groups the open reports; 'closed' the decided ones.
 */
export async function listQueue(options: {
	state: 'open' | 'closed';
	page: number;
	perPage?: number;
}): Promise<Paged<ReportGroup>> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage ?? GROUPS_PER_PAGE)), 100);
	const stateSql = options.state === 'open' ? "state = 'open'" : "state <> 'open'";
	const [countRow] = await sequelize.query<{ n: number }>(
		`SELECT COUNT(*) AS n FROM (SELECT 1 FROM content_reports WHERE ${stateSql} GROUP BY subject_type, subject_id) AS g`,
		{ type: QueryTypes.SELECT }
	);
	const total = Number(countRow?.n ?? 0);
	const window = audit.pageWindow(total, options.page, perPage);
	const groups = await sequelize.query<{
		subjectType: ReportSubjectType;
		subjectId: string;
		n: number;
		latest: Date;
	}>(
		`SELECT subject_type AS subjectType, subject_id AS subjectId, COUNT(*) AS n, MAX(created_at) AS latest
		 FROM content_reports WHERE ${stateSql}
		 GROUP BY subject_type, subject_id
		 ORDER BY latest DESC, subject_type ASC, subject_id ASC
		 LIMIT :limit OFFSET :offset`,
		{ type: QueryTypes.SELECT, replacements: { limit: perPage, offset: window.offset } }
	);

	const summaries = new Map<string, SubjectSummary>();
	for (const type of new Set(groups.map((g) => g.subjectType))) {
		const handler = SUBJECTS[type];
		if (!handler) continue;
		const ids = groups.filter((g) => g.subjectType === type).map((g) => g.subjectId);
		for (const [id, summary] of await handler.summaries(ids))
			summaries.set(`${type}:${id}`, summary);
	}

	const items: ReportGroup[] = [];
	for (const group of groups) {
		const rows = (await ContentReport.findAll({
			where: {
				subjectType: group.subjectType,
				subjectId: group.subjectId,
				state: options.state === 'open' ? 'open' : { [Op.ne]: 'open' }
			},
			include: [
				{ model: User, as: 'reporter', attributes: ['name', 'email'] },
				{ model: User, as: 'decidedBy', attributes: ['name', 'email'] }
			],
			order: [
				['createdAt', 'DESC'],
				['id', 'DESC']
			],
			limit: REPORTS_SHOWN_PER_GROUP
		})) as (ContentReport & { reporter?: User | null; decidedBy?: User | null })[];
		items.push({
			subject: summaries.get(`${group.subjectType}:${group.subjectId}`) ?? {
				type: group.subjectType,
				id: group.subjectId,
				title: `Removed ${group.subjectType} #${group.subjectId}`,
				url: '',
				ownerName: null,
				hidden: null
			},
			reportCount: Number(group.n),
			latestAt: new Date(group.latest).toISOString(),
			reports: rows.map((r) => ({
				id: r.id,
				category: r.category,
				detail: r.detail,
				state: r.state,
				reporter: { name: r.reporter?.name ?? null, email: r.reporter?.email ?? '' },
				createdAt: r.createdAt.toISOString(),
				decidedAt: r.decidedAt ? r.decidedAt.toISOString() : null,
				decidedBy: r.decidedBy ? (r.decidedBy.name ?? r.decidedBy.email) : null
			}))
		});
	}
	return { items, total, page: window.page, perPage, pageCount: window.pageCount };
}

/** Closes every open report on `subject` with `state`; returns their ids. */
async function closeOpenReports(
	subject: { type: ReportSubjectType; id: string },
	state: 'dismissed' | 'actioned',
	actorId: string,
	transaction: Transaction
): Promise<number[]> {
	const open = await ContentReport.findAll({
		where: { subjectType: subject.type, subjectId: subject.id, state: 'open' },
		attributes: ['id'],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (open.length === 0) return [];
	const ids = open.map((r) => r.id);
	// Conditional on state = 'open': a report decided meanwhile is left as it was.
	const [changed] = await ContentReport.update(
		{ state, openMarker: null, decidedById: actorId, decidedAt: wholeSecondNow() },
		{ where: { id: ids, state: 'open' }, transaction }
	);
	return changed === ids.length ? ids : ids.slice(0, changed);
}

/** Dismisses the open reports on an item (no action on the content). */
export async function dismiss(
	actorId: string,
	subject: { type: ReportSubjectType; id: string }
): Promise<Outcome<{ dismissed: number }>> {
	const handler = handlerFor(subject.type);
	if ('kind' in handler) return handler;
	return sequelize.transaction(async (transaction) => {
		if (!(await handler.lock(subject.id, transaction))) return { kind: 'not_found' } as const;
		const ids = await closeOpenReports(subject, 'dismissed', actorId, transaction);
		if (ids.length === 0) {
			return {
				kind: 'conflict',
				message: 'These reports were already decided (perhaps by another editor).'
			} as const;
		}
		await audit.record(
			{
				actorId,
				action: 'content_report.dismissed',
				subjectType: subject.type,
				subjectId: subject.id,
				before: { openReports: ids.length, reportIds: ids },
				after: { state: 'dismissed' }
			},
			transaction
		);
		return { kind: 'ok', dismissed: ids.length } as const;
	});
}

/**
 * Hides an item: the public no longer sees it; its owner (and editors) still do, with
 * `reason`. Open reports on it are closed as actioned.
 */
export async function hide(
	actorId: string,
	subject: { type: ReportSubjectType; id: string },
	reason: string
): Promise<Outcome<{ closedReports: number }>> {
	const handler = handlerFor(subject.type);
	if ('kind' in handler) return handler;
	return sequelize.transaction(async (transaction) => {
		if (!(await handler.lock(subject.id, transaction))) return { kind: 'not_found' } as const;
		const hidden = await handler.hide(subject.id, reason, actorId, transaction);
		if (hidden === 'not_found') return { kind: 'not_found' } as const;
		if (hidden === 'already') {
			return {
				kind: 'conflict',
				message: `This ${subject.type} is already hidden (perhaps by another editor).`
			} as const;
		}
		const ids = await closeOpenReports(subject, 'actioned', actorId, transaction);
		await audit.record(
			{
				actorId,
				action: `${subject.type}.hidden`,
				subjectType: subject.type,
				subjectId: subject.id,
				before: { hidden: false },
				after: { hidden: true, hiddenReason: reason, reportsClosed: ids.length }
			},
			transaction
		);
		return { kind: 'ok', closedReports: ids.length } as const;
	});
}

/** Shows a hidden item again. Reports closed by hiding it stay closed. */
export async function restore(
	actorId: string,
	subject: { type: ReportSubjectType; id: string }
): Promise<Outcome> {
	const handler = handlerFor(subject.type);
	if ('kind' in handler) return handler;
	return sequelize.transaction(async (transaction) => {
		if (!(await handler.lock(subject.id, transaction))) return { kind: 'not_found' } as const;
		const restored = await handler.restore(subject.id, transaction);
		if (restored.kind === 'not_found') return { kind: 'not_found' } as const;
		if (restored.kind === 'not_hidden') {
			return {
				kind: 'conflict',
				message: `This ${subject.type} is not hidden (perhaps another editor restored it).`
			} as const;
		}
		await audit.record(
			{
				actorId,
				action: `${subject.type}.restored`,
				subjectType: subject.type,
				subjectId: subject.id,
				before: { hidden: true, hiddenReason: restored.reason },
				after: { hidden: false }
			},
			transaction
		);
		return { kind: 'ok' } as const;
	});
}
