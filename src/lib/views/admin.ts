/*
 * Accounts and roles as the admin pages, the audit trail and author requests show them.
 * Types only.
 */
import type { Role } from '$lib/domain/types';
import type { AuditSnapshot } from '$lib/server/db/models/AuditEvent';
import type { AuthorRequestState } from '$lib/server/db/models/AuthorRequest';

/** An account as the admin's user list shows it. */
export interface AdminUserRow {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	state: 'active' | 'disabled';
	/** ISO 8601, UTC; null while active. */
	disabledAt: string | null;
	/** When the account was created (ISO 8601, UTC). */
	createdAt: string;
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

/** A request as its author sees it on the account page. */
export interface MyAuthorRequest {
	id: number;
	state: AuthorRequestState;
	pitch: string;
	/** The editor's note, sent with the decision; null while pending or when none was given. */
	decisionNote: string | null;
	/** ISO 8601, UTC. */
	createdAt: string;
	decidedAt: string | null;
}

/** A pending request as editors see it. */
export interface PendingAuthorRequest {
	id: number;
	pitch: string;
	requester: { id: string; name: string | null; email: string; role: Role };
	/** ISO 8601, UTC. */
	createdAt: string;
	/** Whole days since the request was made (0 on the first day). */
	waitingDays: number;
}
