import { error, fail } from '@sveltejs/kit';
import { fieldIssues } from '$lib/schemas/issues';
import { decisionInput } from '$lib/schemas/review';
import { requireRole } from '$lib/server/auth/guards';
import * as reviews from '$lib/server/services/guide-reviews';
import * as reviewPage from '$lib/server/services/review-page';
import { reviewGalleryChanges } from '$lib/server/services/gallery';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const me = requireRole('editor');
	const review = await reviewPage.getReview(me, Number(params.id), url.host);
	if (!review) error(404, 'No submitted revision with that number');
	return { review, photoChanges: await reviewGalleryChanges(review.revisionId) };
};

/** The form's slot notes come as parallel slotLabel / slotNote fields, one pair per slot. */
function decisionFields(data: FormData) {
	const labels = data.getAll('slotLabel').map(String);
	const notes = data.getAll('slotNote').map(String);
	return {
		decision: data.get('decision') ?? undefined,
		note: data.get('note') ?? undefined,
		slotNotes: labels.map((label, i) => ({ label, note: notes[i] ?? '' }))
	};
}

export const actions: Actions = {
	decide: async ({ params, request, url }) => {
		const me = requireRole('editor');
		const data = await request.formData();
		const fields = decisionFields(data);
		const input = decisionInput.safeParse(fields);
		const echo = { note: String(fields.note ?? ''), slotNotes: fields.slotNotes };
		if (!input.success) return fail(400, { ...echo, issues: fieldIssues(input.error) });
		// Publishing is the one decision readers see at once: it takes a second, explicit press
		// (works without JavaScript; nothing is decided until then).
		if (input.data.decision === 'approve' && data.get('confirmed') !== 'yes')
			return { ...echo, confirmPublish: true };
		const outcome = await reviews.decide(me, Number(params.id), input.data, {
			guidesUrl: new URL('/my/guides', url.origin).href
		});
		if (outcome.kind === 'not_found') error(404, 'No submitted revision with that number');
		if (outcome.kind === 'forbidden')
			return fail(403, { ...echo, problem: true, message: outcome.message });
		if (outcome.kind === 'conflict')
			return fail(409, { ...echo, problem: true, message: outcome.message });
		const done = {
			approve: 'Published: this revision is now live.',
			request_changes: 'Sent back to the author with your notes.',
			decline: 'Declined.'
		}[input.data.decision];
		const mailed = outcome.mailed
			? 'The author has been told by e-mail.'
			: 'The e-mail to the author could not be sent; the decision is saved.';
		return { problem: !outcome.mailed, message: `${done} ${mailed}` };
	}
};
