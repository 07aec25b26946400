import { requireRole } from '$lib/server/auth/guards';
import { templateCsv } from '$lib/server/services/catalog-csv-export';
import type { RequestHandler } from './$types';

/** The import template: header plus three invented example parts. */
export const GET: RequestHandler = () => {
	requireRole('editor');
	return new Response(templateCsv(), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="slotwise-parts-template.csv"'
		}
	});
};
