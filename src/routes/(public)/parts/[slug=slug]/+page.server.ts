import { error, fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import { consumeAll } from '$lib/server/rate-limit';
import { priceSightingChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as parts from '$lib/server/services/parts';
import * as photos from '$lib/server/services/photos';
import * as sightingReads from '$lib/server/services/price-sighting-reads';
import * as priceSightings from '$lib/server/services/price-sightings';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const part = await parts.getBySlug(params.slug);
	if (!part) error(404, 'Part not found');
	const user = currentUser();
	// The price-report form and the reader's own sightings; visitors get a sign-in link instead.
	const sightings = user
		? {
				signedIn: true as const,
				regions: await sightingReads.formOptions(),
				mine: await sightingReads.listMine(user.id, params.slug)
			}
		: { signedIn: false as const };
	const pictures = await photos.partPhotos(part.slug);
	return { part, sightings, pictures };
};

const SUBMITTED = {
	created: 'Thank you: your price is waiting for an editor to check it.',
	merged:
		'Someone reported the same price for that day already; yours was merged into it, so it counts as seen by more people.',
	merged_verified:
		'An editor already confirmed that price for that day, so it is in the price history; we counted you as seeing it too.',
	already_quoted: 'That price for that day is already in the price history. Thank you all the same.'
} as const;

export const actions: Actions = {
	reportPrice: async ({ params, request }) => {
		const user = requireUser();
		const fields = formFields(await request.formData());
		const limited = await consumeAll(priceSightingChecks(user.id));
		if (!limited.ok) return tooManyRequests(limited);
		const outcome = await priceSightings.submit(user.id, params.slug, fields);
		switch (outcome.kind) {
			case 'invalid':
				return fail(400, { sighting: { values: fields, issues: outcome.issues } });
			case 'not_found':
				return error(404, 'Part not found');
			case 'already_reported':
				return { sighting: { message: 'You already reported that price for that day.' } };
			default:
				return { sighting: { message: SUBMITTED[outcome.kind] } };
		}
	}
};
