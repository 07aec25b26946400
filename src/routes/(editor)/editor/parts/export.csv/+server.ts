import { requireRole } from '$lib/server/auth/guards';
import { exportCatalogCsv } from '$lib/server/services/catalog-csv-export';
import type { RequestHandler } from './$types';

/**
 * The whole catalog as CSV in the import layout, streamed batch by batch. Cells that a
 * spreadsheet would run as formulas are prefixed with a single quote.
 */
export const GET: RequestHandler = () => {
	requireRole('editor');
	const day = new Date().toISOString().slice(0, 10);
	return new Response(exportCatalogCsv(), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="slotwise-parts-${day}.csv"`,
			'cache-control': 'no-store'
		}
	});
};
