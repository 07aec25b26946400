/*
 * Helpers of the admin components. The shapes they show are in $lib/views.
 */
import type { Issues } from '$lib/schemas/issues';

/** What the last action said about one row: its field messages, or nothing. */
export interface RowFeedback {
	userId?: string;
	issues?: Issues;
}

export function displayName(user: { name: string | null; email: string }): string {
	return user.name?.trim() || user.email;
}
