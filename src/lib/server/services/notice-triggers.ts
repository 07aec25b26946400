/**
 * Which notices a change files (services/notices.ts does the filing). Called after the
 * change has committed, by guide-reviews.ts (a decision) and guide-drafts.ts (a submission);
 * like the e-mails there, a failure here never undoes the change.
 */
import { Op } from 'sequelize';
import type { ReviewDecision } from '$lib/server/db/models/Review';
import { Build, Guide, GuideRevision, User } from '$lib/server/db';
import { followerIds } from './authors';
import { notify } from './notices';

type GuideWithAuthor = Guide & { author?: User | null };

async function revisionWithGuide(revisionId: number) {
	const revision = await GuideRevision.findByPk(revisionId);
	if (!revision) return null;
	const guide = (await Guide.findByPk(revision.guideId, {
		include: [{ model: User, as: 'author', attributes: ['id', 'name'] }]
	})) as GuideWithAuthor | null;
	return guide ? { revision, guide } : null;
}

const DECIDED: Partial<Record<ReviewDecision, string>> = {
	approve: 'was approved and is live',
	request_changes: 'was sent back with notes from the editor',
	decline: 'was declined'
};

/** After an editor's decision on a revision. */
export async function afterDecision(
	revisionId: number,
	decision: ReviewDecision,
	origin: string
): Promise<void> {
	try {
		const found = await revisionWithGuide(revisionId);
		if (!found) return;
		const { revision, guide } = found;
		const author = guide.author;
		const what = DECIDED[decision];
		if (author && what)
			await notify(
				'revision_decided',
				[
					{
						userId: author.id,
						message: `Revision ${revision.number} of “${guide.title}” ${what}.`,
						linkPath: '/my/guides'
					}
				],
				origin
			);
		if (decision !== 'approve') return;
		const earlier = await GuideRevision.count({
			where: { guideId: guide.id, id: { [Op.ne]: revision.id }, publishedAt: { [Op.ne]: null } }
		});
		const authorName = author?.name ?? 'An author you follow';
		if (author && (earlier === 0 || revision.major)) {
			const message =
				earlier === 0
					? `${authorName} published a new guide: “${guide.title}”.`
					: `${authorName} published a major revision of “${guide.title}”.`;
			const followers = await followerIds(author.id);
			await notify(
				'author_published',
				followers.map((userId) => ({ userId, message, linkPath: `/guides/${guide.slug}` })),
				origin
			);
		}
		if (earlier > 0) {
			const builds = await Build.findAll({
				where: {
					sourceGuideId: guide.id,
					[Op.or]: [{ baseRevisionId: null }, { baseRevisionId: { [Op.ne]: revision.id } }]
				},
				attributes: ['id', 'ownerId', 'title']
			});
			await notify(
				'source_revised',
				builds.map((b) => ({
					userId: b.ownerId,
					message: `“${guide.title}”, the guide your build “${b.title}” came from, has a new revision (${revision.number}).`,
					linkPath: `/builds/${b.id}`
				})),
				origin
			);
		}
	} catch (error) {
		console.error(
			JSON.stringify({ t: new Date().toISOString(), kind: 'notice_failed', error: String(error) })
		);
	}
}

/** After an author submits a revision: every editor and admin but the author hears. */
export async function afterSubmit(
	slug: string,
	revisionNumber: number,
	origin: string
): Promise<void> {
	try {
		const guide = (await Guide.findOne({
			where: { slug },
			include: [{ model: User, as: 'author', attributes: ['id', 'name'] }]
		})) as GuideWithAuthor | null;
		if (!guide) return;
		const revision = await GuideRevision.findOne({
			where: { guideId: guide.id, number: revisionNumber }
		});
		if (!revision) return;
		const editors = await User.findAll({
			where: { role: ['editor', 'admin'], disabledAt: null, id: { [Op.ne]: guide.authorId ?? '' } },
			attributes: ['id']
		});
		const by = guide.author?.name ? ` by ${guide.author.name}` : '';
		await notify(
			'queue_gained',
			editors.map((e) => ({
				userId: e.id,
				message: `“${guide.title}”${by} (revision ${revision.number}) is waiting for review.`,
				linkPath: `/review/${revision.id}`
			})),
			origin
		);
	} catch (error) {
		console.error(
			JSON.stringify({ t: new Date().toISOString(), kind: 'notice_failed', error: String(error) })
		);
	}
}
