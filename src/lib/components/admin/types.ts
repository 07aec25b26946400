/*
 * Shapes the admin components receive. Declared here rather than imported from
 * $lib/server so client code never depends on a server module, even for types.
 */
import type { Role } from '$lib/domain/types';

export interface AdminUserRow {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	state: 'active' | 'disabled';
	disabledAt: string | null;
	createdAt: string;
}

/** What the last action said about one row: its field messages, or nothing. */
export interface RowFeedback {
	userId?: string;
	issues?: Record<string, string[]>;
}

export function displayName(user: { name: string | null; email: string }): string {
	return user.name?.trim() || user.email;
}
