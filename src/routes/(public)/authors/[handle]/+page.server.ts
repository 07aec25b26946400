import { error, fail, redirect } from '@sveltejs/kit';
import { authorHandle, followInput } from '$lib/schemas/following';
import { formFields } from '$lib/schemas/account';
import * as authors from '$lib/server/services/authors';
import type { Actions, PageServerLoad } from './$types';

/** A public page per author: name, bio, their published guides, forks, and a follow button. */
export const load: PageServerLoad = async ({ params, locals }) => {
	const handle = authorHandle.safeParse(params.handle);
	if (!handle.success) error(404, 'No such author');
	const page = await authors.authorPage(handle.data, locals.user?.id ?? null);
	if (!page) error(404, 'No such author');
	return { author: page };
};

async function change(
	{ params, locals, request, url }: Parameters<Actions[string]>[0],
	run: (viewerId: string, handle: string) => ReturnType<typeof authors.follow>
) {
	if (!locals.user) redirect(303, `/signin?redirectTo=${encodeURIComponent(url.pathname)}`);
	// The button posts no fields: any field at all (even one named "__proto__", which a plain
	// object would swallow) is refused.
	const data = await request.formData();
	if ([...data.keys()].length > 0 || !followInput.safeParse(formFields(data)).success)
		return fail(400, { message: 'Use the follow button.' });
	const handle = authorHandle.safeParse(params.handle);
	if (!handle.success) error(404, 'No such author');
	const outcome = await run(locals.user.id, handle.data);
	if (outcome.kind === 'not_found') error(404, 'No such author');
	if (outcome.kind === 'conflict') return fail(409, { message: outcome.message });
	return { ok: true };
}

export const actions: Actions = {
	follow: (event) => change(event, authors.follow),
	unfollow: (event) => change(event, authors.unfollow)
};
