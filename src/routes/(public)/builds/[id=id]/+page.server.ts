import { error, fail, redirect } from '@sveltejs/kit';
import {
	deleteBuildForm,
	deleteBuildInput,
	addSlotForm,
	addSlotInput,
	removeSlotInput,
	slotAddress,
	slotAddressForm,
	updateBuildForm,
	updateBuildInput,
	updateSlotForms,
	updateSlotInput,
	versionForm
} from '$lib/schemas/build';
import {
	syncApplyForm,
	syncApplyInput,
	syncDeclineForm,
	syncDeclineInput,
	syncUndoInput,
	withinBudgetApplyForm,
	withinBudgetApplyInput,
	withinBudgetForm,
	withinBudgetInput
} from '$lib/schemas/build-sync';
import { reportForm, reportInput } from '$lib/schemas/content-reports';
import type { FormReader } from '$lib/schemas/form-data';
import { issuesSentence, mergeIssues } from '$lib/schemas/issues';
import type { Issues, Parsed } from '$lib/schemas/issues';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import { formAnswers, parseForm, readFormData } from '$lib/server/http/answers';
import * as buildEdits from '$lib/server/services/build-edits';
import * as buildFork from '$lib/server/services/build-fork';
import * as buildView from '$lib/server/services/build-view';
import * as buildBudget from '$lib/server/services/build-budget';
import * as buildDeclines from '$lib/server/services/build-declines';
import * as buildSync from '$lib/server/services/build-sync';
import * as buildSyncPlan from '$lib/server/services/build-sync-plan';
import * as contentReports from '$lib/server/services/content-reports';
import * as checklists from '$lib/server/services/build-checklist';
import * as photos from '$lib/server/services/photos';
import { stageTickInput } from '$lib/schemas/photos';
import * as drafts from '$lib/server/services/guide-drafts';
import { formPart, typedPart } from '$lib/server/http/build-part-forms';
import type { Actions, PageServerLoad } from './$types';

/*
 * A build: its owner edits it here; anyone may read a public build, and an unlisted one with
 * its link (?key=). Everyone else gets the same 404 as for a build that does not exist.
 */
export const load: PageServerLoad = async ({ params, url }) => {
	const viewer = currentUser();
	// The role lets editors open a hidden or reported build (services/build-access.ts).
	const shareKey = url.searchParams.get('key') ?? undefined;
	const build = await buildView.getBuild(
		viewer ? { id: viewer.id, role: viewer.role } : null,
		Number(params.id),
		{ shareToken: shareKey }
	);
	if (!build) error(404, 'Build not found');
	const sync = build.isOwner ? await buildSyncPlan.syncPlan(viewer?.id ?? '', build.id) : null;
	// The owner's region choices. Parts to add or swap to are searched, never sent: the page's
	// size does not grow with the catalog.
	return {
		build,
		sync: sync && (sync.kind === 'plan' || sync.kind === 'up_to_date') ? sync : null,
		regions: build.isOwner ? await drafts.editorRegions() : null,
		checklist: await checklists.getChecklist(build.id),
		photos: await photos.buildPhotos(build.id),
		// "Report this build": the form posts back with the link token the reader came with.
		signedIn: viewer !== null,
		shareKey: !build.isOwner && build.visibility === 'unlisted' ? (shareKey ?? null) : null
	};
};

/** How this page shows a failed change: one sentence (and the fields) at the top of the page. */
function words(conflict: string) {
	return formAnswers({
		notFound: 'Build not found',
		invalid: (issues: Issues) => ({ problem: true, issues, message: issuesSentence(issues) }),
		conflict: () => ({ problem: true, message: conflict })
	});
}
const STALE_BUILD =
	'This build was changed in another tab or window. The page now shows the stored version; make your change again.';
const page = words(STALE_BUILD);
const sync = formAnswers({
	notFound: 'Build not found',
	invalid: (syncIssues: Issues) => ({
		problem: true,
		syncIssues,
		message: issuesSentence(syncIssues)
	}),
	conflict: () => ({
		problem: true,
		message: 'This build or its guide changed meanwhile. Look at the new table and choose again.'
	})
});
const undo = words('This build changed meanwhile; reload and try again.');
const budget = formAnswers({
	notFound: 'Build not found',
	invalid: (issues: Issues) => ({ problem: true, budgetIssues: Object.values(issues).flat() }),
	conflict: () => ({ problem: true, message: 'This build changed meanwhile; find swaps again.' })
});

/**
 * A slot form: the slot it addresses (the API has it in the path) and the change, read with
 * updateSlotInput, the schema PATCH …/slots/[slotId] uses. Both parsed, messages merged.
 */
function slotChange(
	form: FormReader,
	read: (f: FormReader) => unknown
): Parsed<{ slotId: number; version: number; patch: buildEdits.SlotPatch }> {
	const address = parseForm(form, slotAddress, slotAddressForm);
	const change = parseForm(form, updateSlotInput, read);
	if (address.kind !== 'ok' || change.kind !== 'ok')
		return {
			kind: 'invalid',
			issues: mergeIssues(
				address.kind === 'invalid' ? address.issues : {},
				change.kind === 'invalid' ? change.issues : {}
			)
		};
	const { version, ...patch } = change.data;
	return { kind: 'ok', data: { slotId: address.data.slotId, version, patch } };
}

async function editSlot(
	buildId: number,
	form: FormReader | Request,
	read: (f: FormReader) => unknown,
	done: (patch: buildEdits.SlotPatch) => string
) {
	const me = requireUser();
	const input = slotChange(form instanceof Request ? await readFormData(form) : form, read);
	if (input.kind !== 'ok') return page.failure(input);
	const { slotId, version, patch } = input.data;
	return page.answer(await buildEdits.updateSlot(me.id, buildId, slotId, patch, version), () => ({
		problem: false,
		message: done(patch)
	}));
}

export const actions: Actions = {
	/** "Report this build": signed-in people who may read it (an unlisted one with ?key=); a repeat while the first is open changes nothing. */
	report: async ({ params, request, url }) => {
		const me = requireUser();
		const form = await readFormData(request);
		const reported = formAnswers({
			notFound: () => ({ report: { problem: true, message: 'This build is not available.' } }),
			// The reader's text comes back with the messages.
			invalid: (issues: Issues) => ({
				report: { issues, category: form.text('category') ?? '', detail: form.text('detail') ?? '' }
			}),
			conflict: (outcome) => ({
				report: { problem: true, message: 'message' in outcome ? outcome.message : '' }
			})
		});
		const input = parseForm(form, reportInput, reportForm);
		if (input.kind !== 'ok') return reported.failure(input);
		const outcome = await contentReports.report(me.id, 'build', params.id, input.data, {
			shareToken: url.searchParams.get('key') ?? undefined
		});
		return reported.answer(outcome, (ok) => ({
			report: {
				problem: false,
				message: ok.created
					? 'Thank you: your report is with the editors.'
					: 'You have already reported this build and the editors have not decided yet; nothing new was filed.'
			}
		}));
	},
	/** Ticks or unticks one assembly stage (owner only). */
	tick: async ({ params, request }) => {
		const me = requireUser();
		const form = await readFormData(request);
		const input = stageTickInput.safeParse({
			stage: form.text('stage') ?? '',
			done: form.text('done') === 'true'
		});
		if (!input.success)
			return fail(400, { problem: true, message: 'Choose a stage of this build.' });
		const outcome = await checklists.tick(me.id, Number(params.id), input.data);
		if (outcome.kind === 'not_found') error(404, 'Build not found');
		if (outcome.kind !== 'ok')
			return fail(400, { problem: true, message: 'This build has no such assembly stage.' });
		return { problem: false, message: input.data.done ? 'Stage done.' : 'Stage not done.' };
	},
	/** "Report this photo" on a finished build's photo (?photo=<id>); the same path as any report. */
	reportPhoto: async ({ request, url }) => {
		const me = requireUser();
		const photoId = Number(url.searchParams.get('photo') ?? 0);
		const form = await readFormData(request);
		const reported = formAnswers({
			notFound: () => ({
				photoReport: { photoId, problem: true, message: 'This photo is not available.' }
			}),
			invalid: (issues: Issues) => ({
				photoReport: {
					photoId,
					issues,
					category: form.text('category') ?? '',
					detail: form.text('detail') ?? ''
				}
			}),
			conflict: (outcome) => ({
				photoReport: {
					photoId,
					problem: true,
					message: 'message' in outcome ? outcome.message : ''
				}
			})
		});
		const input = parseForm(form, reportInput, reportForm);
		if (input.kind !== 'ok') return reported.failure(input);
		const outcome = await contentReports.report(me.id, 'photo', String(photoId), input.data, {
			shareToken: url.searchParams.get('key') ?? undefined
		});
		return reported.answer(outcome, (ok) => ({
			photoReport: {
				photoId,
				problem: false,
				message: ok.created
					? 'Thank you: your report is with the editors.'
					: 'You have already reported this photo; nothing new was filed.'
			}
		}));
	},
	/** The part chosen with JavaScript (`partId`), or typed by name or slug without it (`partQuery`). */
	swap: async ({ params, request }) => {
		const me = requireUser();
		const form = await readFormData(request);
		const part = await formPart(me.id, Number(params.id), form);
		if ('message' in part)
			return fail(400, {
				problem: true,
				message: part.message,
				swap: { slotId: form.text('slotId') ?? '', partQuery: typedPart(form), issue: part.message }
			});
		const read = (f: FormReader) => ({ ...updateSlotForms.swap(f), partId: part.partId });
		return editSlot(Number(params.id), form, read, () => 'Swapped.');
	},
	quantity: ({ params, request }) =>
		editSlot(Number(params.id), request, updateSlotForms.quantity, () => 'Quantity saved.'),
	override: ({ params, request }) =>
		editSlot(Number(params.id), request, updateSlotForms.override, () => 'Price saved.'),
	purchase: ({ params, request }) =>
		editSlot(Number(params.id), request, updateSlotForms.purchase, (patch) =>
			patch.purchase?.purchased ? 'Marked bought.' : 'Marked not bought.'
		),
	removeSlot: async ({ params, request }) => {
		const me = requireUser();
		const form = await readFormData(request);
		const address = parseForm(form, slotAddress, slotAddressForm);
		const input = parseForm(form, removeSlotInput, versionForm);
		if (address.kind !== 'ok' || input.kind !== 'ok')
			return page.failure({
				kind: 'invalid',
				issues: mergeIssues(
					address.kind === 'invalid' ? address.issues : {},
					input.kind === 'invalid' ? input.issues : {}
				)
			});
		const outcome = await buildEdits.removeSlot(
			me.id,
			Number(params.id),
			address.data.slotId,
			input.data.version
		);
		return page.answer(outcome, () => ({ problem: false, message: 'Slot removed.' }));
	},
	/** The part chosen with JavaScript (`partId`), or typed by name or slug without it (`partQuery`). */
	addSlot: async ({ params, request }) => {
		const me = requireUser();
		const form = await readFormData(request);
		// What the owner typed comes back with any message, so the form is never emptied.
		const typed = {
			category: form.text('category') ?? '',
			label: (form.text('label') ?? '').slice(0, 80),
			quantity: (form.text('quantity') ?? '').slice(0, 8),
			partQuery: typedPart(form)
		};
		const added = formAnswers({
			notFound: 'Build not found',
			invalid: (issues: Issues) => ({
				problem: true,
				issues,
				message: issuesSentence(issues),
				addSlot: typed
			}),
			conflict: () => ({ problem: true, message: STALE_BUILD, addSlot: typed })
		});
		const part = await formPart(me.id, Number(params.id), form);
		if ('message' in part)
			return added.failure({ kind: 'invalid', issues: { partId: [part.message] } });
		const read = (f: FormReader) => ({ ...addSlotForm(f), partId: part.partId });
		const input = parseForm(form, addSlotInput, read);
		if (input.kind !== 'ok') return added.failure(input);
		const { version, ...slot } = input.data;
		const outcome = await buildEdits.addSlot(me.id, Number(params.id), slot, version);
		return added.answer(outcome, () => ({ problem: false, message: 'Slot added.' }));
	},
	settings: async ({ params, request }) => {
		const me = requireUser();
		const input = parseForm(await readFormData(request), updateBuildInput, updateBuildForm);
		if (input.kind !== 'ok') return page.failure(input);
		const { version, ...patch } = input.data;
		const outcome = await buildEdits.updateBuild(me.id, Number(params.id), patch, version);
		return page.answer(outcome, () => ({ problem: false, message: 'Saved.' }));
	},
	sync: async ({ params, request }) => {
		const me = requireUser();
		const input = parseForm(await readFormData(request), syncApplyInput, syncApplyForm);
		if (input.kind !== 'ok') return sync.failure(input);
		const { version, ...choices } = input.data;
		const outcome = await buildSync.applySync(me.id, Number(params.id), choices, version);
		return sync.answer(outcome, (ok) => ({
			problem: false,
			message: `Updated from the guide: ${ok.changedSlots} changed, ${ok.addedSlots} added, ${ok.removedSlots} removed. You can undo it.`
		}));
	},
	/** "Not now": the owner declines the offered revision; the build stays as it is. */
	declineUpdate: async ({ params, request }) => {
		const me = requireUser();
		const input = parseForm(await readFormData(request), syncDeclineInput, syncDeclineForm);
		if (input.kind !== 'ok') return sync.failure(input);
		const outcome = await buildDeclines.declineUpdate(me.id, Number(params.id), input.data);
		return sync.answer(outcome, (ok) => ({
			problem: false,
			message: `Your build stays on revision ${ok.baseRevisionNumber}. Revision ${ok.revisionNumber} stays offered below if you change your mind.`
		}));
	},
	delete: async ({ params, request }) => {
		const me = requireUser();
		const id = Number(params.id);
		// Someone else's build is a 404 before anything about the form is said.
		if (!(await buildEdits.ownsBuild(me.id, id))) error(404, 'Build not found');
		const input = parseForm(await readFormData(request), deleteBuildInput, deleteBuildForm);
		if (input.kind !== 'ok')
			return fail(400, { problem: true, deleteIssues: Object.values(input.issues).flat() });
		const outcome = await buildFork.deleteBuild(me.id, id);
		if (outcome.kind === 'not_found') error(404, 'Build not found');
		redirect(303, `/builds?deleted=${encodeURIComponent(outcome.title)}`);
	},
	undoSync: async ({ params, request }) => {
		const me = requireUser();
		const input = parseForm(await readFormData(request), syncUndoInput, versionForm);
		if (input.kind !== 'ok') return undo.failure(input);
		const outcome = await buildSync.undoLastSync(me.id, Number(params.id), input.data.version);
		return undo.answer(outcome, () => ({
			problem: false,
			message: 'The last update from the guide was undone.'
		}));
	},
	proposeBudget: async ({ params, request }) => {
		const me = requireUser();
		const form = await readFormData(request);
		// What the reader typed goes back with every answer, so the field never empties.
		const budgetTyped = (form.text('budget') ?? '').slice(0, 40);
		const input = parseForm(form, withinBudgetInput, withinBudgetForm);
		if (input.kind !== 'ok')
			return fail(400, {
				problem: true,
				budgetTyped,
				budgetIssues: Object.values(input.issues).flat()
			});
		const outcome = await buildBudget.proposeWithinBudget(
			me.id,
			Number(params.id),
			input.data.budget
		);
		return budget.answer(outcome, (ok) => ({ budgetResult: ok, budgetTyped }));
	},
	applyBudget: async ({ params, request }) => {
		const me = requireUser();
		const input = parseForm(
			await readFormData(request),
			withinBudgetApplyInput,
			withinBudgetApplyForm
		);
		if (input.kind !== 'ok') return page.failure(input);
		const outcome = await buildBudget.applyWithinBudget(
			me.id,
			Number(params.id),
			input.data.budget,
			input.data.version
		);
		return budget.answer(outcome, (ok) =>
			ok.kind === 'no_fit'
				? fail(422, { problem: true, budgetResult: ok, message: ok.reason })
				: {
						problem: false,
						message: `Applied ${ok.changes} ${ok.changes === 1 ? 'swap' : 'swaps'}; the build is within your budget.`
					}
		);
	}
};
