import { fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { hideInput, reportQueueQuery, reportSubjectInput } from '$lib/schemas/content-reports';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as contentReports from '$lib/server/services/content-reports';
import * as reportQueue from '$lib/server/services/content-report-queue';
import type { Outcome } from '$lib/server/services/users';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	// Keys starting with "/" name a form action (`?state=closed&/hide`) and are not filters.
	const raw = Object.fromEntries([...url.searchParams].filter(([key]) => !key.startsWith('/')));
	const parsed = reportQueueQuery.safeParse(raw);
	// A bad filter shows the first page of open reports with a note rather than an error page.
	const query = parsed.success ? parsed.data : reportQueueQuery.parse({});
	const queryIssues = parsed.success ? {} : fieldIssues(parsed.error);
	const queue = await reportQueue.listQueue({ state: query.state, page: query.page });
	return { query, queryIssues, queue };
};

/** The answer for a refused decision; null when it went through. */
function refusal(outcome: Outcome, subjectKey: string) {
	if (outcome.kind === 'not_found')
		return fail(404, { problem: true, subjectKey, message: 'That content no longer exists.' });
	if (outcome.kind === 'conflict')
		return fail(409, { problem: true, subjectKey, message: outcome.message });
	return null;
}

export const actions: Actions = {
	dismiss: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = reportSubjectInput.safeParse(fields);
		if (!input.success)
			return fail(400, {
				problem: true,
				issues: fieldIssues(input.error),
				message: 'Pick a reported item.'
			});
		const subject = { type: input.data.subjectType, id: input.data.subjectId };
		const outcome = await contentReports.dismiss(me.id, subject);
		if (outcome.kind !== 'ok') return refusal(outcome, `${subject.type}:${subject.id}`);
		return {
			message:
				outcome.dismissed === 1 ? 'Report dismissed.' : `${outcome.dismissed} reports dismissed.`
		};
	},

	hide: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = hideInput.safeParse(fields);
		if (!input.success) {
			return fail(400, {
				problem: true,
				subjectKey: `${fields.subjectType}:${fields.subjectId}`,
				reason: fields.reason ?? '',
				issues: fieldIssues(input.error)
			});
		}
		const subject = { type: input.data.subjectType, id: input.data.subjectId };
		const outcome = await contentReports.hide(me.id, subject, input.data.reason);
		if (outcome.kind !== 'ok') return refusal(outcome, `${subject.type}:${subject.id}`);
		return {
			message: `Hidden from the public; its author sees your reason. ${outcome.closedReports} open report(s) closed.`
		};
	},

	restore: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = reportSubjectInput.safeParse(fields);
		if (!input.success)
			return fail(400, {
				problem: true,
				issues: fieldIssues(input.error),
				message: 'Pick a hidden item.'
			});
		const subject = { type: input.data.subjectType, id: input.data.subjectId };
		const outcome = await contentReports.restore(me.id, subject);
		if (outcome.kind !== 'ok') return refusal(outcome, `${subject.type}:${subject.id}`);
		return { message: 'Restored: it is public again.' };
	}
};
