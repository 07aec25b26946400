import { error, fail } from '@sveltejs/kit';
import { fieldIssues } from '$lib/schemas/issues';
import { mailingInput, newsletterFields, previewRegionQuery } from '$lib/schemas/newsletter';
import { requireRole } from '$lib/server/auth/guards';
import type { Outcome } from '$lib/schemas/issues';
import * as send from '$lib/server/services/mailing-send';
import * as mailings from '$lib/server/services/mailings';
import * as subscribers from '$lib/server/services/subscribers';
import type { Actions, PageServerLoad } from './$types';

/** An editor's mailing: edit, preview per region, a test copy to oneself, start, progress. */
export const load: PageServerLoad = async ({ params, url }) => {
	requireRole('editor');
	const id = Number(params.id);
	const mailing = await mailings.getMailing(id);
	if (!mailing) error(404, 'No such mailing');
	const region = previewRegionQuery.parse(url.searchParams.get('region') ?? undefined) ?? null;
	const [audience, copy, progress, regions] = await Promise.all([
		mailing.status === 'draft' ? send.audienceCount(id) : null,
		send.preview(id, region, url.origin),
		mailings.progress(id),
		subscribers.preferenceChoices().then((c) => c.regions)
	]);
	return {
		mailing,
		audience,
		progress,
		regions,
		preview: copy && {
			subject: copy.message.subject,
			text: copy.message.text,
			headers: copy.headers,
			region: copy.region
		}
	};
};

function answer(outcome: Outcome<object>, fields?: unknown) {
	if (outcome.kind === 'not_found') return fail(404, { message: 'No such mailing.' });
	if (outcome.kind === 'conflict') return fail(409, { message: outcome.message });
	if (outcome.kind === 'invalid') return fail(400, { fields, issues: outcome.issues });
	return null;
}

export const actions: Actions = {
	save: async ({ request, params }) => {
		requireRole('editor');
		const fields = newsletterFields(await request.formData());
		const input = mailingInput.safeParse(fields);
		if (!input.success) return fail(400, { fields, issues: fieldIssues(input.error) });
		const outcome = await mailings.updateMailing(Number(params.id), input.data);
		return (
			answer(outcome, fields) ?? { done: 'Saved. Send yourself a new test copy before starting.' }
		);
	},
	test: async ({ params, url }) => {
		const me = requireRole('editor');
		const region = previewRegionQuery.parse(url.searchParams.get('region') ?? undefined) ?? null;
		const outcome = await send.sendTest(
			Number(params.id),
			{ id: me.id, email: me.email },
			region,
			url.origin
		);
		return answer(outcome) ?? { done: `A test copy is on its way to ${me.email}.` };
	},
	start: async ({ params, url }) => {
		const me = requireRole('editor');
		const outcome = await send.start(Number(params.id), me.id, url.origin);
		const refused = answer(outcome);
		if (refused || outcome.kind !== 'ok') return refused;
		return { done: `Started: ${outcome.recipients} recipients queued.` };
	},
	resend: async ({ params }) => {
		requireRole('editor');
		const outcome = await mailings.resendInDoubt(Number(params.id));
		const refused = answer(outcome);
		if (refused || outcome.kind !== 'ok') return refused;
		return { done: `${outcome.count} copies in doubt queued again.` };
	}
};
