/**
 * The part a build page form names (the owner's add-slot and swap forms), read for the
 * route: kept out of +page.server.ts, which holds every action of the build page.
 */
import { error } from '@sveltejs/kit';
import type { FormReader } from '$lib/schemas/form-data';
import * as buildEdits from '$lib/server/services/build-edits';
import * as partLookup from '$lib/server/services/part-lookup';

/**
 * The part a build form names (services/part-lookup.ts): its `partId`, or the name or slug
 * typed in `partQuery` without JavaScript, looked up in `category` (the slot's, a hidden field
 * of the swap form; the service still refuses a part of another category). Someone else's
 * build is a 404 before anything is looked up.
 */
export async function formPart(ownerId: string, buildId: number, form: FormReader) {
	const typed = form.text('partQuery');
	if (typed?.trim() && !(await buildEdits.ownsBuild(ownerId, buildId)))
		error(404, 'Build not found');
	return partLookup.partIdFromForm(form.number('partId'), typed, form.text('category'));
}

/** What a part field's text field held, kept short: it comes back with the message. */
export const typedPart = (form: FormReader) => (form.text('partQuery') ?? '').slice(0, 100);
