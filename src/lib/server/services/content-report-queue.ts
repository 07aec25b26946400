/**
 * The editors' queue of content reports: reported items grouped, with their reports (reading
 * only; the decisions are content-reports.ts's).
 */
import { Op, QueryTypes } from 'sequelize';
import type { ReportSubjectType } from '$lib/domain/content-reports';
import { ContentReport, User, sequelize } from '$lib/server/db';
import type { ReportGroup, SubjectSummary } from '$lib/views';
import type { Paged } from './audit';
import { SUBJECTS } from './content-report-subjects';
import { pageWindow } from './list-query';

/** Subject groups per page in the editors' queue. */
export const GROUPS_PER_PAGE = 20;
/** Reports shown per group (the count says how many there are in all). */
const REPORTS_SHOWN_PER_GROUP = 10;

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
	const window = pageWindow(total, options.page, perPage);
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
