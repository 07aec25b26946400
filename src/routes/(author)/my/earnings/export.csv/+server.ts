import { requireRole } from '$lib/server/auth/guards';
import { earningsCsv } from '$lib/server/services/tip-earnings';
import type { RequestHandler } from './$types';

/** The author's own tips as CSV: paid and refunded, one line each, amounts in major units. */
export const GET: RequestHandler = async () => {
	const me = requireRole('author', 'editor');
	return new Response(await earningsCsv(me.id), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="slotwise-tips.csv"',
			'cache-control': 'private, no-store'
		}
	});
};
