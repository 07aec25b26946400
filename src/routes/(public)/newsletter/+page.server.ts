import { fail, redirect } from '@sveltejs/kit';
import { manageLinkInput, newsletterFields, subscribeInput } from '$lib/schemas/newsletter';
import { fieldIssues } from '$lib/schemas/issues';
import * as subscribers from '$lib/server/services/subscribers';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const { regions } = await subscribers.preferenceChoices();
	// The footer's form brings the address here (GET), so the visitor only adds choices.
	const email = (url.searchParams.get('email') ?? '').slice(0, 254);
	return {
		regions,
		email,
		sent:
			url.searchParams.get('sent') === 'confirm'
				? 'confirm'
				: url.searchParams.has('sent')
					? 'manage'
					: null
	};
};

export const actions: Actions = {
	// The same answer for every address, new or known (issue 17, "reveal nothing").
	subscribe: async ({ request, url }) => {
		const fields = newsletterFields(await request.formData());
		const input = subscribeInput.safeParse(fields);
		if (!input.success) return fail(400, { fields, issues: fieldIssues(input.error) });
		const outcome = await subscribers.subscribe(input.data, url.origin);
		if (outcome.kind === 'invalid') return fail(400, { fields, issues: outcome.issues });
		redirect(303, '/newsletter?sent=confirm');
	},
	manageLink: async ({ request, url }) => {
		const fields = newsletterFields(await request.formData());
		const input = manageLinkInput.safeParse(fields);
		if (!input.success) return fail(400, { manageIssues: fieldIssues(input.error) });
		await subscribers.requestManageLink(input.data.email, url.origin);
		redirect(303, '/newsletter?sent=manage');
	}
};
