import { json } from '@sveltejs/kit';
import * as regionReads from '$lib/server/services/region-reads';
import type { PublicRegion } from '$lib/views';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/regions (public): every pricing region with its currency, tax display
 * mode, the tax rate in force today (basis points, with the day it took effect and the
 * next recorded change) and the market factor of each part category (basis points).
 */
export const GET: RequestHandler = async () => {
	const list: PublicRegion[] = await regionReads.publicRegions();
	return json({ regions: list }, { headers: { 'cache-control': 'public, max-age=300' } });
};
