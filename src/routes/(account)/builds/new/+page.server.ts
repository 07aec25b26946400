import { error, redirect } from '@sveltejs/kit';
import { forkForm, forkInput } from '$lib/schemas/build';
import { issuesSentence } from '$lib/schemas/issues';
import type { Issues } from '$lib/schemas/issues';
import { requireUser } from '$lib/server/auth/guards';
import { formAnswers, parseForm, readFormData } from '$lib/server/http/answers';
import * as limits from '$lib/server/rate-limit';
import { forkChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as buildFork from '$lib/server/services/build-fork';
import type { Actions, PageServerLoad } from './$types';

// Forking happens from a guide page's button; this address has nothing to show on its own.
export const load: PageServerLoad = () => redirect(303, '/builds');

const answers = formAnswers({
	notFound: 'Guide not found',
	invalid: (issues: Issues) => ({ issues, message: issuesSentence(issues) }),
	conflict: () => ({ message: 'The guide could not be forked.' })
});

export const actions: Actions = {
	/** Forks the guide's published revision into a new private build and opens it (POST /api/v1/guides/[slug]/fork's schema). */
	default: async ({ request }) => {
		const me = requireUser();
		const input = parseForm(await readFormData(request), forkInput, forkForm);
		if (input.kind !== 'ok') return answers.failure(input);
		// This address has no page to show a form message on: the refusal is an error page,
		// with Retry-After set by tooManyRequests (issue 12, item 12).
		const allowed = await limits.consumeAll(forkChecks(me.id));
		if (!allowed.ok) {
			const refused = tooManyRequests(allowed);
			error(refused.status, refused.data.message);
		}
		const outcome = await buildFork.fork(me.id, input.data.guide);
		return answers.answer(outcome, (ok) => redirect(303, `/builds/${ok.id}`));
	}
};
