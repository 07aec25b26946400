import { AUDIT_EVENTS_PER_PAGE, auditQuery, auditWindow } from '$lib/schemas/audit';
import type { AuditQuery } from '$lib/schemas/audit';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as audit from '$lib/server/services/audit';
import type { PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

/** The filters from the URL; a bad value is reported and dropped, the rest still apply. */
function parseFilters(url: URL): { query: AuditQuery; issues: Issues } {
	const raw = Object.fromEntries(url.searchParams);
	const parsed = auditQuery.safeParse(raw);
	if (parsed.success) return { query: parsed.data, issues: {} };
	const issues = fieldIssues(parsed.error);
	const keys = ['action', 'actor', 'subject', 'from', 'to', 'page'];
	const kept = Object.fromEntries(
		Object.entries(raw).filter(([key]) => keys.includes(key) && !(key in issues))
	);
	const retry = auditQuery.safeParse(kept);
	return { query: retry.success ? retry.data : auditQuery.parse({}), issues };
}

export const load: PageServerLoad = async ({ url }) => {
	requireRole('admin');
	const { query, issues } = parseFilters(url);
	const result = await audit.list({
		page: query.page,
		perPage: AUDIT_EVENTS_PER_PAGE,
		action: query.action,
		actorEmail: query.actor,
		subjectType: query.subject,
		...auditWindow(query)
	});
	return { query, issues, result, choices: await audit.filterChoices() };
};
