import { fail, redirect } from '@sveltejs/kit';
import { createGuideInput } from '$lib/schemas/guide-editor';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as limits from '$lib/server/rate-limit';
import { guideCreateChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as draftEdits from '$lib/server/services/guide-draft-edits';
import * as drafts from '$lib/server/services/guide-drafts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole('author', 'editor');
	return { regions: (await drafts.editorCatalog()).regions };
};

function fieldsOf(data: FormData) {
	const text = (name: string) => {
		const v = data.get(name);
		return typeof v === 'string' ? v : '';
	};
	return {
		title: text('title'),
		summary: text('summary'),
		targetBudget: text('targetBudget'),
		baseRegion: text('baseRegion'),
		tags: data.getAll('tags').filter((t): t is string => typeof t === 'string'),
		disclosure: text('disclosure'),
		disclosureNote: text('disclosureNote'),
		walkthroughUrl: text('walkthroughUrl')
	};
}

export const actions: Actions = {
	/** Creates the guide with an empty draft and opens it in the editor. */
	create: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const fields = fieldsOf(await request.formData());
		const input = createGuideInput.safeParse(fields);
		if (!input.success) return fail(400, { fields, issues: fieldIssues(input.error) });
		const allowed = await limits.consumeAll(guideCreateChecks(user.id));
		if (!allowed.ok) return tooManyRequests(allowed, undefined, { fields, issues: {} });
		const outcome = await draftEdits.createGuide(user.id, input.data);
		if (outcome.kind === 'invalid') return fail(400, { fields, issues: outcome.issues });
		redirect(303, `/my/guides/${outcome.slug}/edit`);
	}
};
