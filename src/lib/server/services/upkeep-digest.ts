/**
 * The weekly upkeep digest (issue 19): once per ISO week, each author who turned it on gets
 * one e-mail listing the alerts on their guides that no digest has listed yet, worst first.
 * Nothing is sent when nothing is new. The scheduler (server/schedule) calls
 * `queueWeeklyDigests`; the mail goes through the mail queue (mail/queue), never straight to
 * SMTP, so a crash after the decision still delivers it and the worker sends it once.
 *
 * Exactly once per author and week, whatever runs it: per author one transaction locks the
 * user row (SELECT … FOR UPDATE), looks for the week's row in upkeep_digests, and only if
 * there is none writes that row, queues the message under the key
 * `upkeep-digest.<author>.<week>` and marks the listed alerts with the digest's id. A second
 * process waits on the lock, then finds the row and does nothing; a repeat after a crash
 * finds either everything or nothing (one transaction). The alert rows are not locked (a
 * lock through the join would hold the guides too): one that a price pass removes meanwhile
 * is still listed once, which is true of the moment it was read.
 *
 * "New since the last digest" is the mark, not a time window: an alert is listed once, in
 * the first digest after it appears, even if its row committed while the last digest was
 * being written. The first digest after the author turns it on lists only alerts first seen
 * after that moment (users.upkeep_digest_since; both columns keep whole seconds, so an alert
 * first seen in the very second the digest was turned on counts as already on the
 * dashboard); snoozed and handled alerts wait unlisted.
 */
import { QueryTypes } from 'sequelize';
import { isoWeek } from '$lib/domain/iso-week';
import { sortWorstFirst } from '$lib/domain/upkeep';
import type { UpkeepAlertView } from '$lib/views';
import { sequelize } from '$lib/server/db';
import type { MailTemplate } from '$lib/server/mail';
import { render } from '$lib/server/mail/templates';
import { enqueueMessage } from '$lib/server/mail/queue';
import { pokeInlineWorker } from '$lib/server/mail/queue/inline';
import { ALERT_SELECT, alertView, type AlertRow } from './upkeep-dashboard';

/**
 * The digest for one author: the alerts worst first; null when there are none (no empty
 * mail is sent). `origin` makes the links absolute.
 */
export function composeDigest(
	author: { name: string | null },
	alerts: readonly UpkeepAlertView[],
	origin: string
): MailTemplate | null {
	if (alerts.length === 0) return null;
	const lines = sortWorstFirst([...alerts]).map(
		(a) =>
			`${a.severity === 'conflict' ? '✕ conflict' : '△ caution'} · ${a.guideTitle}: ${a.sentence}`
	);
	return render({
		subject: 'Your guides this week: upkeep alerts',
		greeting: author.name ? `Hello ${author.name},` : 'Hello,',
		before: [
			`${alerts.length === 1 ? 'One new upkeep alert' : `${alerts.length} new upkeep alerts`} on your guides since your last digest:`,
			lines.join('\n')
		],
		actions: [{ label: 'Open My guides', url: `${origin}/my/guides` }],
		why: 'You got this e-mail because you turned on the weekly upkeep digest. Turn it off on My guides.'
	});
}

/** The stable mail-queue key of an author's digest in a week. */
export function digestKey(authorId: string, week: string): string {
	return `upkeep-digest.${authorId}.${week}`;
}

export type DigestDecision = 'queued' | 'nothing_new' | 'already_decided' | 'off';

interface AuthorRow {
	id: string;
	email: string;
	name: string | null;
	upkeepDigest: number | boolean;
	since: Date | null;
	disabledAt: Date | null;
}

/** Decides (and queues) one author's digest for the ISO week of `now`; see the file comment. */
export async function queueDigestFor(
	authorId: string,
	origin: string,
	now = new Date()
): Promise<DigestDecision> {
	const week = isoWeek(now);
	const decision = await sequelize.transaction(async (transaction): Promise<DigestDecision> => {
		const [author] = await sequelize.query<AuthorRow>(
			`SELECT id, email, name, upkeep_digest AS upkeepDigest, upkeep_digest_since AS since,
			        disabled_at AS disabledAt
			   FROM users WHERE id = :authorId FOR UPDATE`,
			{ type: QueryTypes.SELECT, replacements: { authorId }, transaction }
		);
		if (!author || !author.upkeepDigest || author.disabledAt) return 'off';
		const [done] = await sequelize.query<{ id: number }>(
			'SELECT id FROM upkeep_digests WHERE author_id = :authorId AND iso_week = :week',
			{ type: QueryTypes.SELECT, replacements: { authorId, week }, transaction }
		);
		if (done) return 'already_decided';
		const rows = await sequelize.query<AlertRow>(
			`${ALERT_SELECT}
			  WHERE g.author_id = :authorId AND a.digest_id IS NULL AND a.handled_at IS NULL
			    AND (a.snoozed_until IS NULL OR a.snoozed_until <= :now)
			    AND (:since IS NULL OR a.first_seen_at > :since)
			  ORDER BY a.first_seen_at ASC, a.id ASC`,
			{
				type: QueryTypes.SELECT,
				replacements: { authorId, now, since: author.since ?? null },
				transaction
			}
		);
		const alerts = rows.map(alertView);
		await sequelize.query(
			`INSERT INTO upkeep_digests (author_id, iso_week, alert_count, created_at)
			 VALUES (:authorId, :week, :count, :now)`,
			{
				type: QueryTypes.INSERT,
				replacements: { authorId, week, count: alerts.length, now },
				transaction
			}
		);
		const [digest] = await sequelize.query<{ id: number }>(
			'SELECT id FROM upkeep_digests WHERE author_id = :authorId AND iso_week = :week',
			{ type: QueryTypes.SELECT, replacements: { authorId, week }, transaction }
		);
		const digestId = Number(digest?.id);
		const message = composeDigest(author, alerts, origin);
		if (!message) return 'nothing_new';
		const job = await enqueueMessage(
			{ to: author.email, message, key: digestKey(authorId, week) },
			transaction
		);
		await sequelize.query('UPDATE upkeep_digests SET mail_job_id = :jobId WHERE id = :digestId', {
			type: QueryTypes.UPDATE,
			replacements: { jobId: job.id, digestId },
			transaction
		});
		await sequelize.query(
			'UPDATE guide_upkeep_alerts SET digest_id = :digestId WHERE id IN (:ids) AND digest_id IS NULL',
			{
				type: QueryTypes.UPDATE,
				replacements: { digestId, ids: alerts.map((a) => a.id) },
				transaction
			}
		);
		return 'queued';
	});
	if (decision === 'queued') pokeInlineWorker();
	return decision;
}

export interface DigestRun {
	week: string;
	queued: number;
	nothingNew: number;
	alreadyDecided: number;
}

/** The week's digest for every author who has it on (each decided on its own, see above). */
export async function queueWeeklyDigests(origin: string, now = new Date()): Promise<DigestRun> {
	const authors = await sequelize.query<{ id: string }>(
		'SELECT id FROM users WHERE upkeep_digest = 1 AND disabled_at IS NULL ORDER BY id',
		{ type: QueryTypes.SELECT }
	);
	const run: DigestRun = { week: isoWeek(now), queued: 0, nothingNew: 0, alreadyDecided: 0 };
	for (const { id } of authors) {
		const decision = await queueDigestFor(id, origin, now);
		if (decision === 'queued') run.queued++;
		else if (decision === 'nothing_new') run.nothingNew++;
		else if (decision === 'already_decided') run.alreadyDecided++;
	}
	return run;
}
