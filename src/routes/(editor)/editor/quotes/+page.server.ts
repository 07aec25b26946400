import { fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { requireRole } from '$lib/server/auth/guards';
import { withdrawQuoteAction } from '$lib/server/http/quote-actions';
import * as catalogReads from '$lib/server/services/catalog-reads';
import * as catalogStores from '$lib/server/services/catalog-stores';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const [stores, regions, quotes] = await Promise.all([
		catalogReads.listStores(),
		catalogReads.regionOptions(),
		catalogReads.listRecentQuotes({ limit: 25 })
	]);
	return {
		stores,
		regions,
		quotes,
		// Prefill from a part page's "Add a quote" link; the action checks it like any input.
		part: (url.searchParams.get('part') ?? '').slice(0, 140),
		added: url.searchParams.get('added') === '1',
		today: new Date().toISOString().slice(0, 10)
	};
};

export const actions: Actions = {
	withdrawQuote: withdrawQuoteAction,
	create: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const outcome = await catalogStores.addQuote(me.id, fields);
		if (outcome.kind === 'invalid') return fail(400, { issues: outcome.issues, values: fields });
		if (outcome.kind !== 'ok')
			return fail(409, {
				issues: { _form: ['The quote could not be added.'] } as Issues,
				values: fields
			});
		redirect(303, '/editor/quotes?added=1');
	}
};
