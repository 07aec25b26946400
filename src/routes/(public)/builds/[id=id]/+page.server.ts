import { error, fail } from '@sveltejs/kit';
import type { z } from 'zod';
import { formFields } from '$lib/schemas/account';
import { reportInput } from '$lib/schemas/content-reports';
import {
	addSlotForm,
	applyBudgetForm,
	overrideForm,
	proposeBudgetForm,
	purchaseForm,
	quantityForm,
	settingsForm,
	slotForm,
	swapForm,
	syncForm,
	versionForm
} from '$lib/schemas/build-forms';
import { fieldIssues } from '$lib/schemas/issues';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import * as buildEdits from '$lib/server/services/build-edits';
import * as buildView from '$lib/server/services/build-view';
import * as buildBudget from '$lib/server/services/build-budget';
import * as buildSync from '$lib/server/services/build-sync';
import * as buildSyncPlan from '$lib/server/services/build-sync-plan';
import * as contentReports from '$lib/server/services/content-reports';
import * as checklists from '$lib/server/services/build-checklist';
import * as photos from '$lib/server/services/photos';
import { stageTickInput } from '$lib/schemas/photos';
import * as drafts from '$lib/server/services/guide-drafts';
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
	// The owner's choices for adding or swapping to any catalog part, and for the region select.
	return {
		build,
		sync: sync && (sync.kind === 'plan' || sync.kind === 'up_to_date') ? sync : null,
		catalog: build.isOwner ? await drafts.editorCatalog() : null,
		checklist: await checklists.getChecklist(build.id),
		photos: await photos.buildPhotos(build.id),
		// "Report this build": the form posts back with the link token the reader came with.
		signedIn: viewer !== null,
		shareKey: !build.isOwner && build.visibility === 'unlisted' ? (shareKey ?? null) : null
	};
};

type Outcome = Awaited<ReturnType<typeof buildEdits.updateSlot>>;

/** One answer shape for every edit: saved, changed elsewhere (409), invalid (400) or gone (404). */
function answer(outcome: Outcome, done: string) {
	if (outcome.kind === 'not_found') error(404, 'Build not found');
	if (outcome.kind === 'conflict')
		return fail(409, {
			problem: true,
			message:
				'This build was changed in another tab or window. The page now shows the stored version; make your change again.'
		});
	if (outcome.kind === 'invalid')
		return fail(400, {
			problem: true,
			issues: outcome.issues,
			message: Object.values(outcome.issues).flat().join(' ')
		});
	return { problem: false, message: done };
}

async function parse<S extends z.ZodType>(request: Request, schema: S) {
	const parsed = schema.safeParse(formFields(await request.formData()));
	if (!parsed.success)
		return {
			ok: false as const,
			failure: fail(400, {
				problem: true,
				issues: fieldIssues(parsed.error),
				message: Object.values(fieldIssues(parsed.error)).flat().join(' ')
			})
		};
	return { ok: true as const, data: parsed.data as z.output<S> };
}

export const actions: Actions = {
	/** "Report this build": signed-in people who may read it (an unlisted one with ?key=); a repeat while the first is open changes nothing. */
	report: async ({ params, request, url }) => {
		const me = requireUser();
		const fields = formFields(await request.formData());
		const input = reportInput.safeParse(fields);
		if (!input.success) {
			return fail(400, {
				report: {
					issues: fieldIssues(input.error),
					category: fields.category ?? '',
					detail: fields.detail ?? ''
				}
			});
		}
		const outcome = await contentReports.report(me.id, 'build', params.id, input.data, {
			shareToken: url.searchParams.get('key') ?? undefined
		});
		if (outcome.kind === 'not_found')
			return fail(404, { report: { problem: true, message: 'This build is not available.' } });
		if (outcome.kind === 'conflict')
			return fail(409, { report: { problem: true, message: outcome.message } });
		return {
			report: {
				problem: false,
				message: outcome.created
					? 'Thank you: your report is with the editors.'
					: 'You have already reported this build and the editors have not decided yet; nothing new was filed.'
			}
		};
	},
	/** Ticks or unticks one assembly stage (owner only). */
	tick: async ({ params, request }) => {
		const me = requireUser();
		const fields = formFields(await request.formData());
		const input = stageTickInput.safeParse({ stage: fields.stage, done: fields.done === 'true' });
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
		const fields = formFields(await request.formData());
		const input = reportInput.safeParse(fields);
		if (!input.success)
			return fail(400, {
				photoReport: {
					photoId,
					issues: fieldIssues(input.error),
					category: fields.category ?? '',
					detail: fields.detail ?? ''
				}
			});
		const outcome = await contentReports.report(me.id, 'photo', String(photoId), input.data, {
			shareToken: url.searchParams.get('key') ?? undefined
		});
		if (outcome.kind === 'not_found')
			return fail(404, {
				photoReport: { photoId, problem: true, message: 'This photo is not available.' }
			});
		if (outcome.kind === 'conflict')
			return fail(409, { photoReport: { photoId, problem: true, message: outcome.message } });
		return {
			photoReport: {
				photoId,
				problem: false,
				message: outcome.created
					? 'Thank you: your report is with the editors.'
					: 'You have already reported this photo; nothing new was filed.'
			}
		};
	},
	swap: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, swapForm);
		if (!input.ok) return input.failure;
		return answer(
			await buildEdits.updateSlot(
				me.id,
				Number(params.id),
				input.data.slotId,
				{ partId: input.data.partId },
				input.data.version
			),
			'Swapped.'
		);
	},
	quantity: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, quantityForm);
		if (!input.ok) return input.failure;
		return answer(
			await buildEdits.updateSlot(
				me.id,
				Number(params.id),
				input.data.slotId,
				{ quantity: input.data.quantity },
				input.data.version
			),
			'Quantity saved.'
		);
	},
	override: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, overrideForm);
		if (!input.ok) return input.failure;
		return answer(
			await buildEdits.updateSlot(
				me.id,
				Number(params.id),
				input.data.slotId,
				{ priceOverride: input.data.priceOverride },
				input.data.version
			),
			'Price saved.'
		);
	},
	purchase: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, purchaseForm);
		if (!input.ok) return input.failure;
		const done = input.data.purchase.purchased ? 'Marked bought.' : 'Marked not bought.';
		return answer(
			await buildEdits.updateSlot(
				me.id,
				Number(params.id),
				input.data.slotId,
				{ purchase: input.data.purchase },
				input.data.version
			),
			done
		);
	},
	removeSlot: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, slotForm);
		if (!input.ok) return input.failure;
		return answer(
			await buildEdits.removeSlot(me.id, Number(params.id), input.data.slotId, input.data.version),
			'Slot removed.'
		);
	},
	addSlot: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, addSlotForm);
		if (!input.ok) return input.failure;
		const { version, ...slot } = input.data;
		return answer(
			await buildEdits.addSlot(
				me.id,
				Number(params.id),
				slot as Parameters<typeof buildEdits.addSlot>[2],
				version
			),
			'Slot added.'
		);
	},
	settings: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, settingsForm);
		if (!input.ok) return input.failure;
		const { version, ...patch } = input.data;
		return answer(await buildEdits.updateBuild(me.id, Number(params.id), patch, version), 'Saved.');
	},
	sync: async ({ params, request }) => {
		const me = requireUser();
		const input = syncForm.safeParse(await request.formData());
		if (!input.success)
			return fail(400, {
				problem: true,
				syncIssues: fieldIssues(input.error),
				message: 'Check the sync choices.'
			});
		const { version, ...choices } = input.data;
		const outcome = await buildSync.applySync(me.id, Number(params.id), choices, version);
		if (outcome.kind === 'not_found') error(404, 'Build not found');
		if (outcome.kind === 'conflict')
			return fail(409, {
				problem: true,
				message:
					'This build or its guide changed meanwhile. Look at the new table and choose again.'
			});
		if (outcome.kind === 'invalid')
			return fail(400, {
				problem: true,
				syncIssues: outcome.issues,
				message: Object.values(outcome.issues).flat().join(' ')
			});
		return {
			problem: false,
			message: `Synced: ${outcome.changedSlots} changed, ${outcome.addedSlots} added, ${outcome.removedSlots} removed. You can undo it.`
		};
	},
	undoSync: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, versionForm);
		if (!input.ok) return input.failure;
		const outcome = await buildSync.undoLastSync(me.id, Number(params.id), input.data.version);
		if (outcome.kind === 'not_found') error(404, 'Build not found');
		if (outcome.kind === 'conflict')
			return fail(409, {
				problem: true,
				message: 'This build changed meanwhile; reload and try again.'
			});
		if (outcome.kind === 'invalid')
			return fail(400, { problem: true, message: Object.values(outcome.issues).flat().join(' ') });
		return { problem: false, message: 'The last sync was undone.' };
	},
	proposeBudget: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, proposeBudgetForm);
		if (!input.ok)
			return fail(400, { problem: true, budgetIssues: ['Write an amount like 1200 or 1199.99.'] });
		const build = await buildView.getBuild({ id: me.id }, Number(params.id));
		if (!build?.isOwner) error(404, 'Build not found');
		const minor = drafts.toMinor(input.data.budget, build.region.currency);
		if (minor === null)
			return fail(400, {
				problem: true,
				budgetIssues: [`Too many decimals for ${build.region.currency}.`]
			});
		const outcome = await buildBudget.proposeWithinBudget(me.id, build.id, minor);
		if (outcome.kind === 'not_found') error(404, 'Build not found');
		return { budgetResult: outcome };
	},
	applyBudget: async ({ params, request }) => {
		const me = requireUser();
		const input = await parse(request, applyBudgetForm);
		if (!input.ok) return input.failure;
		const outcome = await buildBudget.applyWithinBudget(
			me.id,
			Number(params.id),
			input.data.budgetMinor,
			input.data.version
		);
		if (outcome.kind === 'not_found') error(404, 'Build not found');
		if (outcome.kind === 'conflict')
			return fail(409, {
				problem: true,
				message: 'This build changed meanwhile; find swaps again.'
			});
		if (outcome.kind === 'no_fit')
			return fail(422, { problem: true, budgetResult: outcome, message: outcome.reason });
		return {
			problem: false,
			message: `Applied ${outcome.changes} ${outcome.changes === 1 ? 'swap' : 'swaps'}; the build is within your budget.`
		};
	}
};
