import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/guards';
import * as limits from '$lib/server/rate-limit';
import { forkChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as buildFork from '$lib/server/services/build-fork';
import type { Actions, PageServerLoad } from './$types';

const forkForm = z.object({
	guide: z
		.string()
		.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Unknown guide.')
		.max(140)
});

// Forking happens from a guide page's button; this address has nothing to show on its own.
export const load: PageServerLoad = () => redirect(303, '/builds');

export const actions: Actions = {
	/** Forks the guide's published revision into a new private build and opens it. */
	default: async ({ request }) => {
		const me = requireUser();
		const input = forkForm.safeParse({ guide: (await request.formData()).get('guide') });
		if (!input.success) return fail(400, { message: 'Unknown guide.' });
		// This address has no page to show a form message on: the refusal is an error page,
		// with Retry-After set by tooManyRequests (issue 12, item 12).
		const allowed = await limits.consumeAll(forkChecks(me.id));
		if (!allowed.ok) {
			const refused = tooManyRequests(allowed);
			error(refused.status, refused.data.message);
		}
		const outcome = await buildFork.fork(me.id, input.data.guide);
		if (outcome.kind === 'not_found') error(404, 'Guide not found');
		redirect(303, `/builds/${outcome.id}`);
	}
};
