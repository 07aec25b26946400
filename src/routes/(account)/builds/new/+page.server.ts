import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/guards';
import * as builds from '$lib/server/services/builds';
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
		const outcome = await builds.fork(me.id, input.data.guide);
		if (outcome.kind === 'not_found') error(404, 'Guide not found');
		redirect(303, `/builds/${outcome.id}`);
	}
};
