import { fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { decideAuthorRequestInput, pendingRequestsQuery } from '$lib/schemas/author-requests';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as authorRequests from '$lib/server/services/author-requests';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	// Only ?page= means anything here; other keys (an action name after a POST) are ignored.
	const query = pendingRequestsQuery.safeParse({ page: url.searchParams.get('page') ?? undefined });
	// A bad ?page= shows the first page with a note rather than an error page.
	const pageIssues = query.success ? {} : fieldIssues(query.error);
	const pending = await authorRequests.listPending({ page: query.success ? query.data.page : 1 });
	return { pending, pageIssues };
};

export const actions: Actions = {
	decide: async ({ request, url }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = decideAuthorRequestInput.safeParse(fields);
		if (!input.success) {
			return fail(400, {
				requestId: Number(fields.requestId),
				note: fields.note ?? '',
				issues: fieldIssues(input.error)
			});
		}
		const { requestId, approve, note } = input.data;
		const outcome = await authorRequests.decide(
			me.id,
			requestId,
			{ approve, note },
			{ accountUrl: new URL('/account', url.origin).href }
		);
		if (outcome.kind === 'not_found') {
			return fail(404, { problem: true, message: 'That request no longer exists.' });
		}
		if (outcome.kind === 'conflict') {
			return fail(409, { problem: true, requestId, message: outcome.message });
		}
		const decided = approve ? 'Approved: the reader now has the author role.' : 'Declined.';
		const mailed = outcome.mailed
			? 'They have been told by e-mail.'
			: 'The e-mail to them could not be sent; the decision is saved, so please let them know another way.';
		return { problem: !outcome.mailed, message: `${decided} ${mailed}` };
	}
};
