import { fail, redirect } from '@sveltejs/kit';
import { CATEGORY_LABELS } from '$lib/domain/types';
import { partCategory } from '$lib/schemas/catalog-upkeep';
import { specFields } from '$lib/schemas/spec-form';
import { requireRole } from '$lib/server/auth/guards';
import * as catalogParts from '$lib/server/services/catalog-parts';
import { readPartForm } from '../part-form';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = ({ url }) => {
	requireRole('editor');
	const asked = url.searchParams.get('category');
	const category = partCategory.safeParse(asked);
	if (!category.success) {
		// First step: choose the category; its form comes next.
		return { category: null, unknownCategory: asked !== null && asked !== '' };
	}
	return {
		category: category.data,
		categoryLabel: CATEGORY_LABELS[category.data],
		fields: specFields(category.data),
		unknownCategory: false
	};
};

export const actions: Actions = {
	create: async ({ request }) => {
		const me = requireRole('editor');
		const data = await request.formData();
		const category = partCategory.safeParse(data.get('category'));
		if (!category.success) {
			return fail(400, {
				issues: { category: ['Choose a category first.'] } as Issues,
				values: null
			});
		}
		const values = readPartForm(data, category.data);
		const outcome = await catalogParts.createPart(me.id, { category: category.data, ...values });
		if (outcome.kind === 'invalid') return fail(400, { issues: outcome.issues, values });
		if (outcome.kind !== 'ok')
			return fail(409, {
				issues: { _form: ['The part could not be added.'] } as Issues,
				values
			});
		redirect(303, `/editor/parts/${outcome.part.slug}?added=1`);
	}
};
