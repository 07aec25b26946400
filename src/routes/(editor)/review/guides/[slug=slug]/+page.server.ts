import { error, fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { moderationInput } from '$lib/schemas/review';
import { requireRole } from '$lib/server/auth/guards';
import * as reviews from '$lib/server/services/guide-reviews';
import * as reviewQueue from '$lib/server/services/review-queue';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requireRole('editor');
	const guide = await reviewQueue.getGuideModeration(params.slug);
	if (!guide) error(404, 'Guide not found');
	return { guide };
};

export const actions: Actions = {
	moderate: async ({ params, request, url }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const input = moderationInput.safeParse(fields);
		if (!input.success)
			return fail(400, {
				action: fields.action ?? '',
				reason: fields.reason ?? '',
				issues: fieldIssues(input.error)
			});
		const outcome = await reviews.moderate(me, params.slug, input.data, {
			guidesUrl: new URL('/my/guides', url.origin).href
		});
		if (outcome.kind === 'not_found') error(404, 'Guide not found');
		if (outcome.kind === 'conflict' || outcome.kind === 'forbidden') {
			return fail(409, {
				action: input.data.action,
				reason: input.data.reason,
				problem: true,
				message: outcome.message
			});
		}
		const done =
			input.data.action === 'archive' ? 'Archived.' : 'Unpublished: the guide is no longer public.';
		return {
			problem: !outcome.mailed,
			message: `${done} ${outcome.mailed ? 'The author has been told by e-mail.' : 'The e-mail to the author could not be sent.'}`
		};
	}
};
