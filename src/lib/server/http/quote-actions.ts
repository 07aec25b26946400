import { fail, type RequestEvent } from '@sveltejs/kit';
import { issuesSentence } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as catalogStores from '$lib/server/services/catalog-stores';
import { readFormData } from './answers';

/**
 * POST ?/withdrawQuote, on every editors' page that lists quotes (QuotesTable): the answer
 * is shown above that table, on the page where the editor acted.
 */
export async function withdrawQuoteAction({ request }: RequestEvent) {
	const me = requireRole('editor');
	const form = await readFormData(request);
	const outcome = await catalogStores.withdrawQuote(me.id, { quoteId: form.number('quoteId') });
	if (outcome.kind === 'invalid')
		return fail(400, { withdrawMessage: issuesSentence(outcome.issues) });
	if (outcome.kind !== 'ok')
		return fail(404, { withdrawMessage: 'That quote is not there any more.' });
	return {
		withdrawMessage:
			'Quote withdrawn: no total counts it now, and the guides using it were priced again.'
	};
}
