import type { z } from 'zod';

/** Key under which issues that belong to no single field (e.g. an unexpected field) are listed. */
export const FORM_ISSUES_KEY = '_form';

/**
 * A zod error as form messages: field path (dotted, e.g. `slots.0.partId`) → its messages,
 * in the order zod reported them. Issues about the whole input go under FORM_ISSUES_KEY.
 * Plain data, so an action can return it through `fail(400, { issues })`.
 */
export function fieldIssues(error: z.ZodError): Record<string, string[]> {
	const issues: Record<string, string[]> = {};
	for (const issue of error.issues) {
		const key = issue.path.length > 0 ? issue.path.map(String).join('.') : FORM_ISSUES_KEY;
		(issues[key] ??= []).push(issue.message);
	}
	return issues;
}
