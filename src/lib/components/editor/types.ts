/*
 * Helpers of the editor components' forms. The shapes they show are in $lib/views.
 */

/** Field name → messages, as the actions return them (`spec.<path>` for spec fields). */
export type { Issues } from '$lib/schemas/issues';

/** Messages for one field, and the ids that tie them to their control. */
export function describedBy(
	id: string,
	issues: string[] | undefined,
	hintId?: string
): string | undefined {
	return (
		[hintId, issues?.length ? `${id}-issues` : undefined].filter(Boolean).join(' ') || undefined
	);
}
