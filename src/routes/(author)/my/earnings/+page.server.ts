import { fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { tipSettingsInput } from '$lib/schemas/tips';
import { requireRole } from '$lib/server/auth/guards';
import * as earnings from '$lib/server/services/tip-earnings';
import * as tips from '$lib/server/services/tips';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const me = requireRole('author', 'editor');
	const [summary, settings] = await Promise.all([
		earnings.earnings(me.id),
		tips.getSettings(me.id)
	]);
	return { summary, settings };
};

export const actions: Actions = {
	/** Tips on or off, and the thank-you message readers see after paying. */
	settings: async ({ request }) => {
		const me = requireRole('author', 'editor');
		const fields = formFields(await request.formData());
		const input = tipSettingsInput.safeParse(fields);
		if (!input.success) return fail(400, { issues: fieldIssues(input.error), fields });
		await tips.saveSettings(me.id, input.data);
		return { saved: true };
	}
};
