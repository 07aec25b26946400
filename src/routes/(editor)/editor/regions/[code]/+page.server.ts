import { error, fail } from '@sveltejs/kit';
import { PART_CATEGORIES } from '$lib/domain/types';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { bpToPercent, regionCodeParam, removeTaxRateInput } from '$lib/schemas/regions';
import { requireRole } from '$lib/server/auth/guards';
import * as regionReads from '$lib/server/services/region-reads';
import * as regions from '$lib/server/services/regions';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = async ({ params }) => {
	requireRole('editor');
	const code = regionCodeParam.safeParse(params.code);
	const region = code.success ? await regionReads.getRegion(code.data) : null;
	if (!region) error(404, 'No region has this code.');
	// The form shows factors as percentages; the column holds basis points.
	const settings: Record<string, string> = {
		name: region.name,
		currency: region.currency,
		taxMode: region.taxMode
	};
	for (const c of PART_CATEGORIES)
		settings[`factor.${c}`] = bpToPercent(region.categoryFactorsBp[c]);
	return { region, settings };
};

/** The region code of the URL, or null: an action answers 404 for a code that matches no region. */
function codeOf(raw: string): string | null {
	const code = regionCodeParam.safeParse(raw);
	return code.success ? code.data : null;
}

const NOT_FOUND = {
	issues: { _form: ['No region has this code.'] } as Issues,
	values: {} as Record<string, string>
};

export const actions: Actions = {
	settings: async ({ params, request }) => {
		const me = requireRole('editor');
		const code = codeOf(params.code);
		if (!code) return fail(404, { form: 'settings' as const, ...NOT_FOUND });
		const fields = formFields(await request.formData());
		const outcome = await regions.updateSettings(me.id, code, fields);
		if (outcome.kind === 'invalid')
			return fail(400, { form: 'settings' as const, issues: outcome.issues, values: fields });
		if (outcome.kind === 'not_found') return fail(404, { form: 'settings' as const, ...NOT_FOUND });
		if (outcome.kind !== 'ok')
			return fail(409, {
				form: 'settings' as const,
				issues: { _form: ['The region could not be saved.'] } as Issues,
				values: fields
			});
		return {
			form: 'settings' as const,
			message: outcome.changed
				? 'Region saved. Guide totals in lists are re-priced in the background.'
				: 'Nothing changed, so nothing was saved.'
		};
	},

	addRate: async ({ params, request }) => {
		const me = requireRole('editor');
		const code = codeOf(params.code);
		if (!code) return fail(404, { form: 'rate' as const, ...NOT_FOUND });
		const fields = formFields(await request.formData());
		const outcome = await regions.addTaxRate(me.id, code, fields);
		if (outcome.kind === 'invalid')
			return fail(400, { form: 'rate' as const, issues: outcome.issues, values: fields });
		if (outcome.kind === 'not_found') return fail(404, { form: 'rate' as const, ...NOT_FOUND });
		if (outcome.kind !== 'ok')
			return fail(409, {
				form: 'rate' as const,
				issues: { _form: ['The rate could not be added.'] } as Issues,
				values: fields
			});
		return {
			form: 'rate' as const,
			message: 'Rate added. Guide totals in lists are re-priced in the background.'
		};
	},

	removeRate: async ({ params, request }) => {
		const me = requireRole('editor');
		const code = codeOf(params.code);
		if (!code) return fail(404, { form: 'rate' as const, ...NOT_FOUND });
		const input = removeTaxRateInput.safeParse(formFields(await request.formData()));
		if (!input.success)
			return fail(400, {
				form: 'rate' as const,
				issues: fieldIssues(input.error),
				values: {} as Record<string, string>
			});
		const outcome = await regions.removeTaxRate(me.id, code, input.data.rateId);
		if (outcome.kind === 'not_found') return fail(404, { form: 'rate' as const, ...NOT_FOUND });
		if (outcome.kind === 'conflict')
			return fail(409, {
				form: 'rate' as const,
				issues: { _form: [outcome.message] } as Issues,
				values: {} as Record<string, string>
			});
		return {
			form: 'rate' as const,
			message: 'Rate removed. Guide totals in lists are re-priced in the background.'
		};
	}
};
