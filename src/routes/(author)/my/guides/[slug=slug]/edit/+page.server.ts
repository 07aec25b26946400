import { error, redirect } from '@sveltejs/kit';
import type { PartCategory } from '$lib/domain/types';
import { buildNotesInput, saveDraftInput } from '$lib/schemas/guide-editor';
import { applyOp, fromDraft, toInput } from '$lib/schemas/guide-editor-form';
import { readEditorForm } from '$lib/schemas/guide-editor-post';
import type { EditorDraft } from '$lib/schemas/guide-editor-form';
import { mergeIssues, parseInput } from '$lib/schemas/issues';
import type { Issues } from '$lib/schemas/issues';
import { suggestedAlternateQuery } from '$lib/schemas/upkeep';
import { requireRole } from '$lib/server/auth/guards';
import { formAnswers } from '$lib/server/http/answers';
import * as fit from '$lib/server/services/fit';
import * as draftEdits from '$lib/server/services/guide-draft-edits';
import * as drafts from '$lib/server/services/guide-drafts';
import * as partLookup from '$lib/server/services/part-lookup';
import { guidePhotos } from '$lib/server/services/gallery';
import * as reviews from '$lib/server/services/review-queue';
import type { DraftPartRef, DraftView } from '$lib/views';
import type { Actions, PageServerLoad } from './$types';

/** The guide editor: the author's own guides only (someone else's slug is a 404). */
export const load: PageServerLoad = async ({ params, url }) => {
	const user = requireRole('author', 'editor');
	const draft = await drafts.getDraft(user.id, params.slug);
	if (!draft) error(404, 'Guide not found');
	const photos = (await guidePhotos(user.id, params.slug)) ?? {};
	// The author's view of the guide (state, the editor's latest decision) as My guides shows it.
	const mine = (await reviews.authorDashboard(user.id)).find((g) => g.slug === params.slug);
	const returned =
		mine?.lastDecision?.decision === 'request_changes' &&
		(mine.latestRevision?.status === 'request_changes' || mine.latestRevision?.status === 'draft')
			? mine.lastDecision
			: null;
	// Opened from a fork-insights suggestion: that part joins the slot's alternates (unsaved).
	const query = suggestedAlternateQuery.safeParse({
		slot: url.searchParams.get('slot') ?? undefined,
		alternate: url.searchParams.get('alternate') ?? undefined
	});
	const part = query.success ? await partLookup.partRefBySlug(query.data.alternate) : null;
	// The page names only the parts the draft uses; the pickers search the catalog.
	const catalog = await drafts.editorCatalog(draft, part ? [part] : []);
	return {
		draft,
		suggestedAlternate:
			query.success && part
				? { slotKey: query.data.slot, partId: part.id, name: `${part.brand} ${part.model}` }
				: null,
		status: mine
			? { state: mine.state, live: mine.live, latestRevision: mine.latestRevision }
			: null,
		returned,
		catalog,
		photos
	};
};

/** The fit report's conflicts for the saved picks, as sentences (empty when none). */
async function fitConflicts(
	slots: { category: PartCategory; label: string; quantity: number; pickPartId: number }[]
): Promise<string[]> {
	if (slots.length === 0) return [];
	const outcome = await fit.check({
		slots: slots.map((s, i) => ({
			key: `slot-${i + 1}`,
			label: s.label,
			category: s.category,
			quantity: s.quantity,
			partId: s.pickPartId
		}))
	});
	if (outcome.kind !== 'ok') return [];
	return outcome.result.findings.filter((f) => f.severity === 'conflict').map((f) => f.message);
}

async function owned(slug: string) {
	const user = requireRole('author', 'editor');
	if (!(await drafts.getDraft(user.id, slug))) error(404, 'Guide not found');
	return user;
}

/**
 * How the editor shows a failure: every answer carries the author's text back (`fields`), so
 * nothing typed is lost, with the parts it names (`parts`: the page holds no catalog to name
 * them from); a stale version brings the stored copy to compare with.
 */
function editorAnswers(fields: EditorDraft, version: unknown, parts: DraftPartRef[]) {
	const sent = typeof version === 'number' ? version : undefined;
	return formAnswers({
		notFound: 'Guide not found',
		invalid: (issues: Issues) => ({ fields, version: sent, issues, parts }),
		conflict: (outcome) => {
			if (!('current' in outcome))
				return { fields, version: sent, issues: { _form: [outcome.message] } as Issues, parts };
			const current = outcome.current as DraftView;
			// The next save is meant to go over the stored version the author has now seen.
			return {
				fields,
				version: current.version,
				conflict: { stored: fromDraft(current), version: current.version },
				parts: [...parts, ...drafts.draftParts(current)]
			};
		}
	});
}

/**
 * The posted working copy with its typed part names looked up (the pickers without
 * JavaScript post a name or slug; services/part-lookup.ts), the messages of names that name
 * no single part, and the parts the copy now names.
 */
async function readWithParts(data: FormData) {
	const form = readEditorForm(data);
	const typed = await partLookup.resolveTypedParts(applyOp(form.draft, form.op));
	return {
		...form,
		draft: typed.draft,
		issues: mergeIssues(form.issues, typed.issues),
		parts: await partLookup.partsNamedIn(typed.draft)
	};
}

/** `issues` without the fields `shown` already has a message for. */
function besides(issues: Issues, shown: Issues): Issues {
	return Object.fromEntries(Object.entries(issues).filter(([key]) => !(key in shown)));
}

/**
 * Reads the posted form in one pass (caps included), looks up typed part names, then parses
 * it with saveDraftInput, the schema PUT /api/v1/guides/[slug]/draft uses, and saves it.
 */
async function save(userId: string, slug: string, data: FormData) {
	const form = await readWithParts(data);
	const answers = editorAnswers(form.draft, form.version, form.parts);
	const parsed = parseInput(saveDraftInput, { ...toInput(form.draft), version: form.version });
	// A typed name that named no part has its message; the schema's "choose a part" would repeat it.
	const issues = mergeIssues(
		form.issues,
		parsed.kind === 'invalid' ? besides(parsed.issues, form.issues) : {}
	);
	if (parsed.kind !== 'ok' || Object.keys(issues).length > 0)
		return { ok: false as const, failure: answers.failure({ kind: 'invalid', issues }) };
	const { version, ...draft } = parsed.data;
	const outcome = await draftEdits.saveDraft(userId, slug, draft, version);
	if (outcome.kind !== 'saved') return { ok: false as const, failure: answers.failure(outcome) };
	return {
		ok: true as const,
		draft: outcome.draft,
		fields: form.draft,
		parts: form.parts,
		input: draft
	};
}

export const actions: Actions = {
	/** No-JS add/remove/reorder: applies `op` to the posted form and shows it again, unsaved. */
	edit: async ({ params, request }) => {
		await owned(params.slug);
		const form = await readWithParts(await request.formData());
		return {
			fields: form.draft,
			version: typeof form.version === 'number' ? form.version : undefined,
			issues: form.issues,
			parts: form.parts,
			edited: true
		};
	},
	preview: async ({ params, request }) => {
		await owned(params.slug);
		const form = readEditorForm(await request.formData());
		const parts = await partLookup.partsNamedIn(form.draft);
		const notes = parseInput(buildNotesInput, form.draft.buildNotes);
		if (notes.kind !== 'ok') return editorAnswers(form.draft, form.version, parts).failure(notes);
		return {
			fields: form.draft,
			version: typeof form.version === 'number' ? form.version : undefined,
			parts,
			preview: drafts.previewNotes(notes.data)
		};
	},
	save: async ({ params, request }) => {
		const user = await owned(params.slug);
		const result = await save(user.id, params.slug, await request.formData());
		if (!result.ok) return result.failure;
		return {
			saved: true,
			version: result.draft.version,
			revisionNumber: result.draft.revisionNumber,
			// The saved slots' own keys, in order: slots added since the page loaded take theirs.
			slotKeys: result.draft.slots.map((s) => s.slotKey)
		};
	},
	/** Saves what is in the form, then freezes it as a revision for review (POST …/submit). */
	submit: async ({ params, request, url }) => {
		const user = await owned(params.slug);
		const data = await request.formData();
		const result = await save(user.id, params.slug, data);
		if (!result.ok) return result.failure;
		// A guide whose fit report has a conflict (no display output, a board that does not fit)
		// is saved, not submitted, until the author says to submit it as it is.
		const conflicts = await fitConflicts(result.input.slots);
		if (conflicts.length > 0 && data.get('acknowledgeConflicts') !== 'yes')
			return {
				saved: true,
				fields: result.fields,
				parts: result.parts,
				version: result.draft.version,
				revisionNumber: result.draft.revisionNumber,
				fitConflicts: conflicts
			};
		const outcome = await draftEdits.submit(user.id, params.slug, result.draft.version, {
			guidesUrl: new URL('/my/guides', url.origin).href
		});
		const submitted = formAnswers({
			notFound: 'Guide not found',
			invalid: (issues: Issues) => ({ version: result.draft.version, issues }),
			conflict: () => ({
				version: result.draft.version,
				issues: { _form: ['Changed elsewhere; reload and submit again.'] } as Issues
			})
		});
		return submitted.answer(outcome, () =>
			redirect(303, `/my/guides?submitted=${encodeURIComponent(params.slug)}`)
		);
	}
};
