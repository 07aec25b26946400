import { error, fail, redirect } from '@sveltejs/kit';
import { buildNotesInput, draftInput } from '$lib/schemas/guide-editor';
import { applyOp, fromDraft, fromForm, toInput } from '$lib/schemas/guide-editor-form';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as draftEdits from '$lib/server/services/guide-draft-edits';
import * as drafts from '$lib/server/services/guide-drafts';
import { guidePhotos } from '$lib/server/services/gallery';
import type { Actions, PageServerLoad } from './$types';

/** The guide editor: the author's own guides only (someone else's slug is a 404). */
export const load: PageServerLoad = async ({ params }) => {
	const user = requireRole('author', 'editor');
	const draft = await drafts.getDraft(user.id, params.slug);
	if (!draft) error(404, 'Guide not found');
	const photos = (await guidePhotos(user.id, params.slug)) ?? {};
	return { draft, catalog: await drafts.editorCatalog(), photos };
};

async function owned(slug: string) {
	const user = requireRole('author', 'editor');
	if (!(await drafts.getDraft(user.id, slug))) error(404, 'Guide not found');
	return user;
}

/** Validates and saves the posted form; the shape every failure returns keeps the author's text. */
async function save(userId: string, slug: string, data: FormData) {
	const fields = fromForm(data);
	const version = Number(data.get('version'));
	const parsed = draftInput.safeParse(toInput(fields));
	if (!parsed.success)
		return {
			ok: false as const,
			failure: fail(400, { fields, version, issues: fieldIssues(parsed.error) })
		};
	if (!Number.isInteger(version) || version < 1)
		return {
			ok: false as const,
			failure: fail(400, {
				fields,
				version,
				issues: { _form: ['Reload the editor: the form lost its version.'] }
			})
		};
	const outcome = await draftEdits.saveDraft(userId, slug, parsed.data, version);
	switch (outcome.kind) {
		case 'not_found':
			error(404, 'Guide not found');
		// falls through: error() throws
		case 'invalid':
			return {
				ok: false as const,
				failure: fail(400, { fields, version, issues: outcome.issues })
			};
		case 'conflict':
			return {
				ok: false as const,
				// The next save is meant to go over the stored version the author has now seen.
				failure: fail(409, {
					fields,
					version: outcome.current.version,
					conflict: { stored: fromDraft(outcome.current), version: outcome.current.version }
				})
			};
		case 'saved':
			return {
				ok: true as const,
				version: outcome.draft.version,
				revisionNumber: outcome.draft.revisionNumber
			};
	}
}

export const actions: Actions = {
	/** No-JS add/remove/reorder: applies `op` to the posted form and shows it again, unsaved. */
	edit: async ({ params, request }) => {
		await owned(params.slug);
		const data = await request.formData();
		const op = data.get('op');
		return {
			fields: applyOp(fromForm(data), typeof op === 'string' ? op : ''),
			version: Number(data.get('version')),
			edited: true
		};
	},
	preview: async ({ params, request }) => {
		await owned(params.slug);
		const data = await request.formData();
		const fields = fromForm(data);
		const notes = buildNotesInput.safeParse(fields.buildNotes);
		if (!notes.success)
			return fail(400, {
				fields,
				version: Number(data.get('version')),
				issues: fieldIssues(notes.error)
			});
		return {
			fields,
			version: Number(data.get('version')),
			preview: drafts.previewNotes(notes.data)
		};
	},
	save: async ({ params, request }) => {
		const user = await owned(params.slug);
		const result = await save(user.id, params.slug, await request.formData());
		if (!result.ok) return result.failure;
		return { saved: true, version: result.version, revisionNumber: result.revisionNumber };
	},
	/** Saves what is in the form, then freezes it as a revision for review. */
	submit: async ({ params, request, url }) => {
		const user = await owned(params.slug);
		const result = await save(user.id, params.slug, await request.formData());
		if (!result.ok) return result.failure;
		const outcome = await draftEdits.submit(user.id, params.slug, result.version, {
			guidesUrl: new URL('/my/guides', url.origin).href
		});
		if (outcome.kind === 'not_found') error(404, 'Guide not found');
		if (outcome.kind === 'invalid' || outcome.kind === 'conflict') {
			return fail(outcome.kind === 'conflict' ? 409 : 400, {
				version: result.version,
				issues:
					outcome.kind === 'invalid'
						? outcome.issues
						: { _form: ['Changed elsewhere; reload and submit again.'] }
			});
		}
		redirect(303, `/my/guides?submitted=${encodeURIComponent(params.slug)}`);
	}
};
