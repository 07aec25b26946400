/**
 * The audit trail of privileged changes (roles, disabled accounts, author requests).
 * Events are written inside the transaction of the change they describe, so a change
 * and its record commit or roll back together; nothing ever edits or deletes one.
 */
import type { Transaction, WhereOptions } from 'sequelize';
import { AuditEvent, User } from '$lib/server/db';
import type { AuditSnapshot } from '$lib/server/db/models/AuditEvent';

export type { AuditSnapshot } from '$lib/server/db/models/AuditEvent';

/** The actions this area writes. Other areas may add their own `subject.verb` names. */
export const AUDIT_ACTIONS = [
	'user.role_changed',
	'user.disabled',
	'user.enabled',
	'author_request.approved',
	'author_request.declined'
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

export interface AuditEntry {
	id: number;
	actor: { id: string; name: string | null; email: string } | null;
	action: string;
	subjectType: string;
	subjectId: string;
	before: AuditSnapshot | null;
	after: AuditSnapshot | null;
	/** ISO 8601, UTC. */
	createdAt: string;
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

/** Page arithmetic shared by the account services: clamps `page` into 1..pageCount. */
export function pageWindow(total: number, page: number, perPage: number) {
	const pageCount = Math.max(1, Math.ceil(total / perPage));
	const current = Math.min(Math.max(1, Math.trunc(page)), pageCount);
	return { page: current, pageCount, offset: (current - 1) * perPage };
}

/**
 * Appends one event inside `transaction` (required: an audit row written outside the
 * change's transaction could survive a rolled-back change, or go missing for a kept one).
 */
export async function record(event: AuditEventInput, transaction: Transaction): Promise<AuditEntry> {
	if (!ACTION_PATTERN.test(event.action)) {
		throw new Error(`Audit action must look like "subject.verb", got ${JSON.stringify(event.action)}`);
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

/** Events newest first, optionally only one action or one actor's. `perPage` is capped at 100. */
export async function list(options: {
	page: number;
	perPage: number;
	action?: string;
	actorId?: string;
}): Promise<Paged<AuditEntry>> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage)), 100);
	const where: WhereOptions<AuditEvent> = {};
	if (options.action) where.action = options.action;
	if (options.actorId) where.actorId = options.actorId;

	const total = await AuditEvent.count({ where });
	const window = pageWindow(total, options.page, perPage);
	const rows = await AuditEvent.findAll({
		where,
		include: [{ model: User, as: 'actor', attributes: ['id', 'name', 'email'] }],
		order: [
			['createdAt', 'DESC'],
			['id', 'DESC']
		],
		limit: perPage,
		offset: window.offset
	});
	return {
		items: rows.map((row) => toEntry(row, (row as AuditEvent & { actor?: User | null }).actor ?? null)),
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
