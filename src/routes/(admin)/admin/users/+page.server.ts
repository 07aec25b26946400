import { fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { changeRoleInput, setDisabledInput, userSearchQuery } from '$lib/schemas/users';
import type { UserSearchQuery } from '$lib/schemas/users';
import { requireRole } from '$lib/server/auth/guards';
import * as users from '$lib/server/services/users';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

/**
 * The search from the URL. Keys starting with "/" name a form action (`?q=x&/changeRole`
 * keeps the search across a POST) and are not part of it. A bad value is reported and
 * dropped, so one typo in the address does not lose the rest of the search.
 */
function parseSearch(url: URL): { query: UserSearchQuery; issues: Issues } {
	const raw = Object.fromEntries([...url.searchParams].filter(([key]) => !key.startsWith('/')));
	const parsed = userSearchQuery.safeParse(raw);
	if (parsed.success) return { query: parsed.data, issues: {} };
	const issues = fieldIssues(parsed.error);
	const kept = Object.fromEntries(
		Object.entries(raw).filter(([key]) => key in userSearchQuery.shape && !(key in issues))
	);
	return { query: userSearchQuery.parse(kept), issues };
}

export const load: PageServerLoad = async ({ url }) => {
	const me = requireRole('admin');
	const { query, issues } = parseSearch(url);
	const result = await users.search({ q: query.q, role: query.role, page: query.page });
	return { meId: me.id, query, issues, result };
};

/** The answer for a refused change; null when the change went through. */
function refusal(outcome: users.Outcome, userId: string) {
	if (outcome.kind === 'not_found')
		return fail(404, { problem: true, message: 'That account no longer exists.' });
	if (outcome.kind === 'conflict')
		return fail(409, { problem: true, userId, message: outcome.message });
	return null;
}

export const actions: Actions = {
	changeRole: async ({ request }) => {
		const me = requireRole('admin');
		const fields = formFields(await request.formData());
		const input = changeRoleInput.safeParse(fields);
		if (!input.success) {
			return fail(400, { userId: fields.userId, issues: fieldIssues(input.error) });
		}
		const outcome = await users.changeRole(me.id, input.data.userId, input.data.role);
		if (outcome.kind !== 'ok') return refusal(outcome, input.data.userId);
		const name = outcome.user.name ?? outcome.user.email;
		return {
			userId: outcome.user.id,
			message: `${name} now has the ${outcome.user.role} role, from their next page on.`
		};
	},

	setDisabled: async ({ request }) => {
		const me = requireRole('admin');
		const fields = formFields(await request.formData());
		const input = setDisabledInput.safeParse(fields);
		if (!input.success) {
			return fail(400, { userId: fields.userId, issues: fieldIssues(input.error) });
		}
		const outcome = await users.setDisabled(me.id, input.data.userId, input.data.disabled);
		if (outcome.kind !== 'ok') return refusal(outcome, input.data.userId);
		const name = outcome.user.name ?? outcome.user.email;
		return {
			userId: outcome.user.id,
			message:
				outcome.user.state === 'disabled'
					? `${name} is disabled and has been signed out everywhere.`
					: `${name} is enabled again and can sign in.`
		};
	}
};
