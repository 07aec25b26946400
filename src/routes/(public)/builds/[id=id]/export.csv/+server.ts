import { error } from '@sveltejs/kit';
import { currentUser } from '$lib/server/auth/guards';
import * as buildExport from '$lib/server/services/build-export';
import type { RequestHandler } from './$types';

/** The build's shopping list as CSV, in its region and currency (same visibility rules as the page). */
export const GET: RequestHandler = async ({ params, url }) => {
	const viewer = currentUser();
	const csv = await buildExport.exportCsv(viewer ? { id: viewer.id } : null, Number(params.id), {
		shareToken: url.searchParams.get('key') ?? undefined
	});
	if (csv === null) error(404, 'Build not found');
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="build-${params.id}-shopping-list.csv"`,
			'cache-control': 'private, no-store'
		}
	});
};
