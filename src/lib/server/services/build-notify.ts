/**
 * The e-mail to build owners when their build's source guide publishes a new revision
 * (issue 7 "E-mail"). Called by services/guide-reviews.ts decide() after an approval has
 * committed: the approval stands whether or not any message goes out, so this never throws;
 * failures are logged (without addresses) and the build stays un-notified for that revision.
 *
 * Who gets it: owners of builds of the guide with notifyOnNewRevision on, whose build is not
 * already on that revision, and who were not already told about it (lastNotifiedRevisionId);
 * disabled accounts get nothing. One message per owner, with a link per build. Marking a
 * build notified does not bump its version (that is for the owner's edits) nor its
 * updatedAt, so an open build tab is not made stale by a mail.
 */
import { Op } from 'sequelize';
import { Build, Guide, GuideRevision, User } from '$lib/server/db';
import * as mail from '$lib/server/mail';
import { templates } from '$lib/server/mail';
import { emailWanted } from './notices';

export interface NotifyResult {
	/** Owners e-mailed. */
	mailed: number;
	/** Owners whose message failed (logged). */
	failed: number;
	/** Builds marked as notified about this revision. */
	builds: number;
}

function logFailure(what: string, error: unknown, extra: Record<string, unknown> = {}): void {
	console.error(
		JSON.stringify({
			t: new Date().toISOString(),
			kind: 'mail_failed',
			mail: 'guide_revision_for_builds',
			what,
			...extra,
			error: error instanceof Error ? { name: error.name, message: error.message } : String(error)
		})
	);
}

/** E-mails the owners of the guide's builds about `revisionId`; `origin` builds the links (e.g. https://slotwise.example). */
export async function notifyForks(
	guideId: number,
	revisionId: number,
	origin: string
): Promise<NotifyResult> {
	const result: NotifyResult = { mailed: 0, failed: 0, builds: 0 };
	try {
		const [guide, revision] = await Promise.all([
			Guide.findByPk(guideId),
			GuideRevision.findByPk(revisionId)
		]);
		if (!guide || !revision || revision.guideId !== guide.id) return result;
		const builds = (await Build.findAll({
			where: {
				sourceGuideId: guide.id,
				notifyOnNewRevision: true,
				[Op.and]: [
					{
						[Op.or]: [
							{ lastNotifiedRevisionId: null },
							{ lastNotifiedRevisionId: { [Op.ne]: revisionId } }
						]
					},
					{ [Op.or]: [{ baseRevisionId: null }, { baseRevisionId: { [Op.ne]: revisionId } }] }
				]
			},
			include: [{ model: User, as: 'owner', attributes: ['id', 'email', 'name', 'disabledAt'] }],
			order: [['id', 'ASC']]
		})) as (Build & { owner?: User | null })[];
		const byOwner = new Map<string, { owner: User; builds: Build[] }>();
		for (const b of builds) {
			if (!b.owner || b.owner.disabledAt) continue;
			const entry = byOwner.get(b.owner.id) ?? { owner: b.owner, builds: [] };
			entry.builds.push(b);
			byOwner.set(b.owner.id, entry);
		}
		// Owners who turned this e-mail off on the account page still get the in-app notice.
		const wanted = await emailWanted([...byOwner.keys()], 'source_revised');
		for (const { owner, builds: own } of byOwner.values()) {
			if (!wanted.has(owner.id)) continue;
			try {
				const message = templates.guideRevisionForBuilds({
					name: owner.name ?? '',
					guideTitle: guide.title,
					revision: revision.number,
					builds: own.map((b) => ({ title: b.title, url: new URL(`/builds/${b.id}`, origin).href }))
				});
				await mail.send(owner.email, message);
				result.mailed++;
			} catch (error) {
				result.failed++;
				logFailure('send', error, { guideId, revisionId });
				continue;
			}
			const [marked] = await Build.update(
				{ lastNotifiedRevisionId: revisionId },
				{ where: { id: own.map((b) => b.id) }, silent: true }
			);
			result.builds += marked;
		}
	} catch (error) {
		logFailure('notify', error, { guideId, revisionId });
	}
	return result;
}

/** notifyForks for the guide the revision belongs to (what decide() calls after an approval). */
export async function notifyForksOfRevision(
	revisionId: number,
	origin: string
): Promise<NotifyResult> {
	try {
		const revision = await GuideRevision.findByPk(revisionId, { attributes: ['id', 'guideId'] });
		if (!revision) return { mailed: 0, failed: 0, builds: 0 };
		return await notifyForks(revision.guideId, revisionId, origin);
	} catch (error) {
		logFailure('notify', error, { revisionId });
		return { mailed: 0, failed: 0, builds: 0 };
	}
}
