/**
 * What an author sees of the upkeep alerts (upkeep-alerts.ts computes them): the open ones on
 * their guides, worst first, each with the sentence and the editor link that focuses the
 * slot; snoozing and marking handled; and the author's switch for the weekly digest of new
 * alerts (off unless they turn it on; upkeep-digest.ts sends it). Another person's alert is
 * not_found, as if it did not exist.
 */
import { QueryTypes } from 'sequelize';
import type { Severity } from '$lib/domain/build-parts';
import type { SetAsideAlertView, UpkeepAlertView } from '$lib/views';
import { sortWorstFirst, upkeepSentence, type UpkeepKind } from '$lib/domain/upkeep';
import { fieldIssues, type Outcome } from '$lib/schemas/issues';
import { handleAlertInput, snoozeAlertInput, upkeepThresholdInput } from '$lib/schemas/upkeep';
import { Guide, sequelize } from '$lib/server/db';
import { refreshRevisions } from './guide-prices';

export type { SetAsideAlertView, UpkeepAlertView };

const DAY_MS = 86_400_000;

export interface AlertRow {
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

export function alertView(row: AlertRow): UpkeepAlertView {
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

export const ALERT_SELECT = `SELECT a.id, g.slug, g.title, a.kind, a.severity, r.code AS regionCode,
                       a.slot_key AS slotKey, a.details, a.first_seen_at AS firstSeenAt
                  FROM guide_upkeep_alerts a
                  JOIN guides g ON g.id = a.guide_id AND g.published_revision_id = a.revision_id
                  LEFT JOIN regions r ON r.id = a.region_id`;

/** The open alerts on the author's guides (not handled, not snoozed now), worst first. */
export async function openAlerts(authorId: string, now = new Date()): Promise<UpkeepAlertView[]> {
	const rows = await sequelize.query<AlertRow>(
		`${ALERT_SELECT}
		  WHERE g.author_id = :authorId AND a.handled_at IS NULL
		    AND (a.snoozed_until IS NULL OR a.snoozed_until <= :now)
		  ORDER BY a.first_seen_at ASC, a.id ASC`,
		{ type: QueryTypes.SELECT, replacements: { authorId, now } }
	);
	return sortWorstFirst(rows.map(alertView));
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
 * The alerts the author set aside that still hold: snoozed until a later moment, or marked
 * handled. Listed under the open ones so nothing set aside is out of reach.
 */
export async function setAsideAlerts(
	authorId: string,
	now = new Date()
): Promise<SetAsideAlertView[]> {
	const rows = await sequelize.query<
		AlertRow & { snoozedUntil: Date | null; handledAt: Date | null }
	>(
		`${ALERT_SELECT.replace(
			'a.first_seen_at AS firstSeenAt',
			'a.first_seen_at AS firstSeenAt, a.snoozed_until AS snoozedUntil, a.handled_at AS handledAt'
		)}
		  WHERE g.author_id = :authorId
		    AND (a.handled_at IS NOT NULL OR a.snoozed_until > :now)
		  ORDER BY a.first_seen_at ASC, a.id ASC`,
		{ type: QueryTypes.SELECT, replacements: { authorId, now } }
	);
	return rows.map((row) => ({
		...alertView(row),
		handled: row.handledAt !== null,
		snoozedUntil:
			row.handledAt === null && row.snoozedUntil ? new Date(row.snoozedUntil).toISOString() : null
	}));
}

/** Brings a snoozed or handled alert back among the open ones now. */
export async function bringBack(authorId: string, raw: unknown): Promise<Outcome> {
	const input = handleAlertInput.safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	if (!(await ownAlert(authorId, input.data.alertId))) return { kind: 'not_found' };
	await sequelize.query(
		'UPDATE guide_upkeep_alerts SET handled_at = NULL, snoozed_until = NULL WHERE id = :id',
		{ type: QueryTypes.UPDATE, replacements: { id: input.data.alertId } }
	);
	return { kind: 'ok' };
}

/**
 * Turns the author's weekly digest on or off. Turning it on (from off) notes the moment, so
 * the first digest lists only alerts seen since then (services/upkeep-digest.ts); a repeated
 * "on" from a stale tab keeps the first moment.
 */
export async function setDigest(userId: string, enabled: boolean, now = new Date()): Promise<void> {
	await sequelize.query(
		`UPDATE users SET upkeep_digest_since =
		   CASE WHEN :enabled AND NOT upkeep_digest THEN :now ELSE upkeep_digest_since END,
		   upkeep_digest = :enabled
		 WHERE id = :userId`,
		{ type: QueryTypes.UPDATE, replacements: { userId, enabled, now } }
	);
}

/**
 * Sets how far (whole percent) a guide's total may move in a region before the author is
 * alerted, then works the author's live guides out again so the list answers at once.
 */
export async function setMoveThreshold(
	userId: string,
	input: unknown
): Promise<Outcome<{ percent: number }>> {
	const parsed = upkeepThresholdInput.safeParse(input);
	if (!parsed.success) return { kind: 'invalid', issues: fieldIssues(parsed.error) };
	await sequelize.query(`UPDATE users SET upkeep_move_threshold_bp = :bp WHERE id = :userId`, {
		type: QueryTypes.UPDATE,
		replacements: { userId, bp: parsed.data.percent * 100 }
	});
	const live = await Guide.findAll({
		where: { authorId: userId },
		attributes: ['publishedRevisionId'],
		raw: true
	});
	await refreshRevisions(
		live.flatMap((g) => (g.publishedRevisionId ? [g.publishedRevisionId] : []))
	);
	return { kind: 'ok', percent: parsed.data.percent };
}

/** The author's move threshold in whole percent (10 unless they chose another). */
export async function moveThresholdPercent(userId: string): Promise<number> {
	const [row] = await sequelize.query<{ bp: number }>(
		`SELECT upkeep_move_threshold_bp AS bp FROM users WHERE id = :userId`,
		{ type: QueryTypes.SELECT, replacements: { userId } }
	);
	return Math.round(Number(row?.bp ?? 1000) / 100);
}
