import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guards';
import { EcbRatesError } from '$lib/server/fx/ecb';
import * as fx from '$lib/server/services/fx';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('editor');
	return { rates: await fx.latest(), staleAfterDays: fx.STALE_AFTER_DAYS };
};

export const actions: Actions = {
	refresh: async () => {
		requireRole('editor');
		try {
			const result = await fx.refresh();
			const changed = result.created.length + result.updated.length;
			return {
				message:
					changed > 0
						? `Stored the rates of ${result.asOf}: ${result.created.length} new, ${result.updated.length} changed. ` +
							'Guide totals in lists are re-priced in the background.'
						: `The rates of ${result.asOf} were already stored.`
			};
		} catch (e) {
			// The feed being down is expected now and then: say so, keep the stored rates.
			if (e instanceof EcbRatesError)
				return fail(502, {
					problem: `Could not fetch the rates (${e.message}). The stored rates stay in use.`
				});
			throw e;
		}
	}
};
