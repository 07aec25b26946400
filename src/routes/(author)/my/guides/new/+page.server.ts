import { redirect } from '@sveltejs/kit';
import { createGuideForm, createGuideInput } from '$lib/schemas/guide-editor';
import { FormReader } from '$lib/schemas/form-data';
import type { Issues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import { formAnswers, parseForm } from '$lib/server/http/answers';
import * as limits from '$lib/server/rate-limit';
import { guideCreateChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as draftEdits from '$lib/server/services/guide-draft-edits';
import * as drafts from '$lib/server/services/guide-drafts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('author', 'editor');
	return { regions: await drafts.editorRegions() };
};

export const actions: Actions = {
	/** Creates the guide with an empty draft and opens it in the editor (POST /api/v1/guides's schema). */
	create: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const form = new FormReader(await request.formData());
		// What the author typed goes back with the messages.
		const fields = createGuideForm(form);
		const answers = formAnswers({
			notFound: 'Guide not found',
			invalid: (issues: Issues) => ({ fields, issues }),
			conflict: () => ({ fields, issues: { _form: ['The guide could not be created.'] } })
		});
		const input = parseForm(form, createGuideInput, createGuideForm);
		if (input.kind !== 'ok') return answers.failure(input);
		const allowed = await limits.consumeAll(guideCreateChecks(user.id));
		if (!allowed.ok) return tooManyRequests(allowed, undefined, { fields, issues: {} });
		const outcome = await draftEdits.createGuide(user.id, input.data);
		return answers.answer(outcome, (ok) => redirect(303, `/my/guides/${ok.slug}/edit`));
	}
};
