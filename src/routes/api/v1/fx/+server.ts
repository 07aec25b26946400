import { json } from '@sveltejs/kit';
import * as fx from '$lib/server/services/fx';
import type { RequestHandler } from './$types';

/** The latest euro reference rate per currency, with its date and a staleness flag. */
export const GET: RequestHandler = async () => {
	const rates = await fx.latest();
	return json({ base: 'EUR', staleAfterDays: fx.STALE_AFTER_DAYS, rates });
};
