import { error, fail } from '@sveltejs/kit';
import { CATEGORY_LABELS } from '$lib/domain/types';
import { specFields } from '$lib/schemas/spec-form';
import { requireRole } from '$lib/server/auth/guards';
import { withdrawQuoteAction } from '$lib/server/http/quote-actions';
import * as catalogParts from '$lib/server/services/catalog-parts';
import * as catalogReads from '$lib/server/services/catalog-reads';
import * as photos from '$lib/server/services/photos';
import { readPartForm } from '../part-form';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = async ({ params, url }) => {
	requireRole('editor');
	const part = await catalogReads.getPart(params.slug);
	if (!part) error(404, 'No part has this slug.');
	return {
		part,
		categoryLabel: CATEGORY_LABELS[part.category],
		fields: specFields(part.category),
		quotes: await catalogReads.listRecentQuotes({ partSlug: part.slug, limit: 10 }),
		added: url.searchParams.get('added') === '1',
		pictures: await photos.partPhotos(part.slug)
	};
};

export const actions: Actions = {
	withdrawQuote: withdrawQuoteAction,
	save: async ({ params, request }) => {
		const me = requireRole('editor');
		const part = await catalogReads.getPart(params.slug);
		if (!part)
			return fail(404, {
				issues: { _form: ['No part has this slug.'] } as Issues,
				values: null,
				saved: false
			});
		const values = readPartForm(await request.formData(), part.category);
		const outcome = await catalogParts.updatePart(me.id, params.slug, values);
		if (outcome.kind === 'invalid')
			return fail(400, {
				issues: outcome.issues,
				values: { ...values, slug: part.slug },
				saved: false
			});
		if (outcome.kind === 'not_found')
			return fail(404, {
				issues: { _form: ['No part has this slug.'] } as Issues,
				values: null,
				saved: false
			});
		if (outcome.kind !== 'ok')
			return fail(409, {
				issues: { _form: ['The part could not be saved.'] } as Issues,
				values: null,
				saved: false
			});
		return { saved: true, changed: outcome.changed };
	}
};
