import { fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import {
	pendingSightingsQuery,
	rejectSightingInput,
	verifySightingInput
} from '$lib/schemas/price-sightings';
import { requireRole } from '$lib/server/auth/guards';
import * as sightingReads from '$lib/server/services/price-sighting-reads';
import * as priceSightings from '$lib/server/services/price-sightings';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const raw = {
		page: url.searchParams.get('page') ?? undefined,
		region: url.searchParams.get('region') ?? undefined,
		q: url.searchParams.get('q') ?? undefined
	};
	const query = pendingSightingsQuery.safeParse(raw);
	// A bad filter shows the unfiltered first page with a note rather than an error page.
	const queryIssues = query.success ? {} : fieldIssues(query.error);
	const filters = query.success ? query.data : { page: 1, q: '', region: undefined };
	const pending = await sightingReads.listPending(filters);
	return { pending, filters: { q: filters.q, region: filters.region ?? '' }, queryIssues };
};

function answer(outcome: priceSightings.DecideOutcome, sightingId: number, done: string) {
	switch (outcome.kind) {
		case 'invalid':
			return fail(400, { sightingId, issues: outcome.issues });
		case 'not_found':
			return fail(404, { problem: true, message: 'That sighting no longer exists.' });
		case 'conflict':
			return fail(409, { problem: true, sightingId, message: outcome.message });
		case 'ok':
			return { problem: false, message: done };
	}
}

export const actions: Actions = {
	verify: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = verifySightingInput.safeParse(fields);
		if (!input.success)
			return fail(400, { sightingId: Number(fields.sightingId), issues: fieldIssues(input.error) });
		const outcome = await priceSightings.verify(me.id, input.data.sightingId);
		return answer(
			outcome,
			input.data.sightingId,
			'Verified: the price is now a quote in the part’s price history.'
		);
	},
	reject: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = rejectSightingInput.safeParse(fields);
		if (!input.success) {
			return fail(400, {
				sightingId: Number(fields.sightingId),
				reason: fields.reason ?? '',
				issues: fieldIssues(input.error)
			});
		}
		const outcome = await priceSightings.reject(me.id, input.data.sightingId, input.data.reason);
		return answer(
			outcome,
			input.data.sightingId,
			'Rejected: the people who reported it can see your reason.'
		);
	}
};
