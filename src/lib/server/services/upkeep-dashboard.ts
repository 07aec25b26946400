/**
 * What an author sees of the upkeep alerts (upkeep-alerts.ts computes them): the open ones on
 * their guides, worst first, each with the sentence and the editor link that focuses the
 * slot; snoozing and marking handled; and the weekly digest of new alerts (off unless the
 * author turned it on). Another person's alert is not_found, as if it did not exist.
 */
import { QueryTypes } from 'sequelize';
import type { Severity } from '$lib/domain/build-parts';
import type { UpkeepAlertView } from '$lib/views';
import { sortWorstFirst, upkeepSentence, type UpkeepKind } from '$lib/domain/upkeep';
import { fieldIssues, type Outcome } from '$lib/schemas/issues';
import { handleAlertInput, snoozeAlertInput } from '$lib/schemas/upkeep';
import { User, sequelize } from '$lib/server/db';
import * as mail from '$lib/server/mail';
import type { MailTemplate } from '$lib/server/mail';
import { render } from '$lib/server/mail/templates';

export type { UpkeepAlertView };

const DAY_MS = 86_400_000;

interface AlertRow {
	id: number;
	slug: string;
	title: string;
	kind: UpkeepKind;
	severity: Severity;
	regionCode: string | null;
	slotKey: string | null;
	details: unknown;
	firstSeenAt: Date;
}

function view(row: AlertRow): UpkeepAlertView {
	const details = (
		typeof row.details === 'string' ? JSON.parse(row.details) : row.details
	) as Record<string, unknown>;
	const editor = `/my/guides/${row.slug}/edit`;
	return {
		id: Number(row.id),
		guideSlug: row.slug,
		guideTitle: row.title,
		kind: row.kind,
		severity: row.severity,
		regionCode: row.regionCode,
		slotKey: row.slotKey,
		sentence: upkeepSentence(row.kind, details),
		firstSeenAt: new Date(row.firstSeenAt).toISOString(),
		editorHref: row.slotKey ? `${editor}#slot-${encodeURIComponent(row.slotKey)}` : editor
	};
}

const SELECT = `SELECT a.id, g.slug, g.title, a.kind, a.severity, r.code AS regionCode,
                       a.slot_key AS slotKey, a.details, a.first_seen_at AS firstSeenAt
                  FROM guide_upkeep_alerts a
                  JOIN guides g ON g.id = a.guide_id AND g.published_revision_id = a.revision_id
                  LEFT JOIN regions r ON r.id = a.region_id`;

/** The open alerts on the author's guides (not handled, not snoozed now), worst first. */
export async function openAlerts(authorId: string, now = new Date()): Promise<UpkeepAlertView[]> {
	const rows = await sequelize.query<AlertRow>(
		`${SELECT}
		  WHERE g.author_id = :authorId AND a.handled_at IS NULL
		    AND (a.snoozed_until IS NULL OR a.snoozed_until <= :now)
		  ORDER BY a.first_seen_at ASC, a.id ASC`,
		{ type: QueryTypes.SELECT, replacements: { authorId, now } }
	);
	return sortWorstFirst(rows.map(view));
}

async function ownAlert(authorId: string, alertId: number): Promise<boolean> {
	const [row] = await sequelize.query<{ id: number }>(
		`SELECT a.id FROM guide_upkeep_alerts a JOIN guides g ON g.id = a.guide_id
		  WHERE a.id = :alertId AND g.author_id = :authorId`,
		{ type: QueryTypes.SELECT, replacements: { alertId, authorId } }
	);
	return row !== undefined;
}

/** Hides the alert for 7 or 30 days; it comes back then if the condition still holds. */
export async function snoozeAlert(
	authorId: string,
	raw: unknown,
	now = new Date()
): Promise<Outcome> {
	const input = snoozeAlertInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	if (!(await ownAlert(authorId, input.data.alertId))) return { kind: 'not_found' };
	await sequelize.query('UPDATE guide_upkeep_alerts SET snoozed_until = :until WHERE id = :id', {
		type: QueryTypes.UPDATE,
		replacements: {
			id: input.data.alertId,
			until: new Date(now.getTime() + input.data.days * DAY_MS)
		}
	});
	return { kind: 'ok' };
}

/**
 * Marks the alert handled: it stays hidden while the same condition holds. If the condition
 * clears and comes back later, that is a new alert.
 */
export async function markHandled(
	authorId: string,
	raw: unknown,
	now = new Date()
): Promise<Outcome> {
	const input = handleAlertInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	if (!(await ownAlert(authorId, input.data.alertId))) return { kind: 'not_found' };
	await sequelize.query('UPDATE guide_upkeep_alerts SET handled_at = :now WHERE id = :id', {
		type: QueryTypes.UPDATE,
		replacements: { id: input.data.alertId, now }
	});
	return { kind: 'ok' };
}

/**
 * The weekly digest for one author: the alerts first seen since `since` that are still
 * open, worst first; null when there are none (no empty mail is sent). `origin` makes the
 * links absolute.
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
			`${alerts.length === 1 ? 'One new upkeep alert' : `${alerts.length} new upkeep alerts`} on your guides since last week:`,
			lines.join('\n')
		],
		actions: [{ label: 'Open My guides', url: `${origin}/my/guides` }],
		why: 'You got this e-mail because you turned on the weekly upkeep digest. Turn it off on My guides.'
	});
}

/**
 * Sends the digest to every author who turned it on. For now it goes out through the mail
 * module directly; it belongs on the newsletter's queue once that lands.
 */
export async function sendWeeklyDigests(origin: string, now = new Date()): Promise<number> {
	const since = new Date(now.getTime() - 7 * DAY_MS);
	const authors = await User.findAll({ where: { upkeepDigest: true, disabledAt: null } });
	let sent = 0;
	for (const author of authors) {
		const fresh = (await openAlerts(author.id, now)).filter(
			(a) => new Date(a.firstSeenAt) >= since
		);
		const message = composeDigest(author, fresh, origin);
		if (!message) continue;
		await mail.send(author.email, message);
		sent++;
	}
	return sent;
}

/** Turns the author's weekly digest on or off. */
export async function setDigest(userId: string, enabled: boolean): Promise<void> {
	await User.update({ upkeepDigest: enabled }, { where: { id: userId } });
}
