/*
 * Helpers of the admin components. The shapes they show are in $lib/views.
 */

/** What the last action said about one row: its field messages, or nothing. */
export interface RowFeedback {
	userId?: string;
	issues?: Record<string, string[]>;
}

export function displayName(user: { name: string | null; email: string }): string {
	return user.name?.trim() || user.email;
}
