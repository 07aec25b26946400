/**
 * The audit trail of privileged changes (roles, disabled accounts, author requests).
 * Events are written inside the transaction of the change they describe, so a change
 * and its record commit or roll back together; nothing ever edits or deletes one.
 */
import { Op, QueryTypes } from 'sequelize';
import type { Transaction, WhereOptions } from 'sequelize';
import { AuditEvent, User, sequelize } from '$lib/server/db';
import type { AuditSnapshot } from '$lib/server/db/models/AuditEvent';
import type { AuditEntry } from '$lib/views';
import { escapeLike, pageWindow } from './list-query';

export type { AuditSnapshot } from '$lib/server/db/models/AuditEvent';

/** The actions this area writes. Other areas may add their own `subject.verb` names. */
export const AUDIT_ACTIONS = [
	'user.role_changed',
	'user.disabled',
	'user.enabled',
	'author_request.approved',
	'author_request.declined',
	'price_sighting.verified',
	'price_sighting.rejected',
	'caution_rule.created',
	'caution_rule.updated',
	'caution_rule.deactivated',
	'caution_rule.activated',
	'caution_rule.deleted',
	'content_report.dismissed',
	'guide.hidden',
	'guide.restored',
	'build.hidden',
	'build.restored',
	'photo.hidden',
	'photo.restored',
	'tip_note.hidden',
	'tip_note.restored',
	'guide_revision.approved',
	'guide_revision.changes_requested',
	'guide_revision.declined',
	'guide.unpublished',
	'guide.archived',
	'review.self_review_override'
] as const;
export type KnownAuditAction = (typeof AUDIT_ACTIONS)[number];

/** What a caller records: who (null for the system), what, on which record, and the change. */
export interface AuditEventInput {
	actorId: string | null;
	/** Dotted `subject.verb`, lower case, e.g. 'user.role_changed'. */
	action: KnownAuditAction | (string & {});
	subjectType: string;
	subjectId: string | number;
	before?: AuditSnapshot | null;
	after?: AuditSnapshot | null;
}

/** One page of a list plus what pagination links need. */
export interface Paged<T> {
	items: T[];
	total: number;
	/** 1-based, clamped to the last page. */
	page: number;
	perPage: number;
	/** At least 1, so "page 1 of 1" reads right for an empty list. */
	pageCount: number;
}

const ACTION_PATTERN = /^[a-z][a-z_]*\.[a-z][a-z_]*$/;

/**
 * Appends one event inside `transaction` (required: an audit row written outside the
 * change's transaction could survive a rolled-back change, or go missing for a kept one).
 */
export async function record(
	event: AuditEventInput,
	transaction: Transaction
): Promise<AuditEntry> {
	if (!ACTION_PATTERN.test(event.action)) {
		throw new Error(
			`Audit action must look like "subject.verb", got ${JSON.stringify(event.action)}`
		);
	}
	const row = await AuditEvent.create(
		{
			actorId: event.actorId,
			action: event.action,
			subjectType: event.subjectType,
			subjectId: String(event.subjectId),
			before: event.before ?? null,
			after: event.after ?? null
		},
		{ transaction }
	);
	return toEntry(row, null);
}

/**
 * Events newest first, optionally filtered: one action, one actor (by id, or by a part of
 * their e-mail, case-insensitive, wildcards literal), one subject type, and a time window
 * `from` ≤ createdAt < `to`. `perPage` is capped at 100.
 */
export async function list(options: {
	page: number;
	perPage: number;
	action?: string;
	actorId?: string;
	actorEmail?: string;
	subjectType?: string;
	from?: Date;
	to?: Date;
}): Promise<Paged<AuditEntry>> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage)), 100);
	const where: WhereOptions<AuditEvent> = {};
	if (options.action) where.action = options.action;
	if (options.actorId) where.actorId = options.actorId;
	if (options.subjectType) where.subjectType = options.subjectType;
	if (options.from || options.to) {
		where.createdAt = {
			...(options.from ? { [Op.gte]: options.from } : {}),
			...(options.to ? { [Op.lt]: options.to } : {})
		};
	}
	const email = options.actorEmail?.trim().toLowerCase();
	// With an e-mail filter the actor join is required (events by the system or by a
	// deleted account have no actor and cannot match).
	const actorInclude = {
		model: User,
		as: 'actor',
		attributes: ['id', 'name', 'email'],
		...(email ? { required: true, where: { email: { [Op.like]: `%${escapeLike(email)}%` } } } : {})
	};

	const total = await AuditEvent.count({ where, include: email ? [actorInclude] : [] });
	const window = pageWindow(total, options.page, perPage);
	const rows = await AuditEvent.findAll({
		where,
		include: [actorInclude],
		order: [
			['createdAt', 'DESC'],
			['id', 'DESC']
		],
		limit: perPage,
		offset: window.offset
	});
	return {
		items: rows.map((row) =>
			toEntry(row, (row as AuditEvent & { actor?: User | null }).actor ?? null)
		),
		total,
		page: window.page,
		perPage,
		pageCount: window.pageCount
	};
}

function toEntry(row: AuditEvent, actor: User | null): AuditEntry {
	return {
		id: row.id,
		actor: actor ? { id: actor.id, name: actor.name, email: actor.email } : null,
		action: row.action,
		subjectType: row.subjectType,
		subjectId: row.subjectId,
		// Sequelize parses JSON columns on read, so these are values, not text.
		before: row.before ?? null,
		after: row.after ?? null,
		createdAt: row.createdAt.toISOString()
	};
}

/** The actions and subject types that occur in the trail (plus the known actions), for filter lists. */
export async function filterChoices(): Promise<{ actions: string[]; subjectTypes: string[] }> {
	const rows = await sequelize.query<{ action: string; subjectType: string }>(
		'SELECT DISTINCT action, subject_type AS subjectType FROM audit_events',
		{ type: QueryTypes.SELECT }
	);
	const actions = new Set<string>([...AUDIT_ACTIONS, ...rows.map((r) => r.action)]);
	return {
		actions: [...actions].sort(),
		subjectTypes: [...new Set(rows.map((r) => r.subjectType))].sort()
	};
}
