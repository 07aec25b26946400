/**
 * What waits for an editor: the counts the editor overview and the section tabs show, so an
 * editor sees at a glance where work is queued without opening every queue.
 */
import { Op, QueryTypes } from 'sequelize';
import { AuthorRequest, Guide, GuideRevision, PriceSighting, sequelize } from '$lib/server/db';

export type WaitingCounts = {
	reviews: number;
	reports: number;
	sightings: number;
	authorRequests: number;
};

export async function waitingCounts(): Promise<WaitingCounts> {
	const [reviews, reportRows, sightings, authorRequests] = await Promise.all([
		// The same rule as the review queue: submitted, not yet decided, on a guide still in play.
		GuideRevision.count({
			where: { submittedAt: { [Op.ne]: null }, reviewedAt: null },
			include: [
				{
					model: Guide,
					as: 'guide',
					where: { state: { [Op.notIn]: ['archived', 'declined'] } },
					required: true
				}
			]
		}),
		// The report queue lists one entry per reported thing, so count things, not reports.
		sequelize.query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM (SELECT 1 FROM content_reports WHERE state = 'open' GROUP BY subject_type, subject_id) AS g`,
			{ type: QueryTypes.SELECT }
		),
		PriceSighting.count({ where: { state: 'pending' } }),
		AuthorRequest.count({ where: { state: 'pending' } })
	]);
	return { reviews, reports: Number(reportRows[0]?.n ?? 0), sightings, authorRequests };
}
