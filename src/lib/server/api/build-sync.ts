/*
 * The build sync and within-budget JSON API (issue 7):
 *   GET  /api/v1/builds/[id]/sync                 → 200 { kind: 'plan', plan } | { kind: 'up_to_date', version, lastSync }
 *   POST /api/v1/builds/[id]/sync                 { version, choices, takeAllNonConflicting, upstreamRevisionId? }
 *   POST /api/v1/builds/[id]/sync/undo            { version }
 *   POST /api/v1/builds/[id]/within-budget        { budget } → 200 proposal | 422 { message }
 *   POST /api/v1/builds/[id]/within-budget/apply  { budget, version } → 200 applied | 422 | 409
 * Owner only (anyone else's build is a 404 with no data), visitors 401, JSON only (the hook
 * answers 415 to other bodies), stale version 409 { message, current }, bad input 400
 * { message, issues } with field paths.
 */
import { json } from '@sveltejs/kit';
import type { RequestEvent } from '@sveltejs/kit';
import {
	syncApplyInput,
	syncUndoInput,
	withinBudgetApplyInput,
	withinBudgetInput
} from '$lib/schemas/build-sync';
import { requireUser } from '$lib/server/auth/guards';
import * as budget from '$lib/server/services/build-budget';
import type { BudgetNoFit } from '$lib/views';
import * as sync from '$lib/server/services/build-sync';
import * as syncPlan from '$lib/server/services/build-sync-plan';
import { CHANGED_ELSEWHERE } from './builds';
import { invalid, notFound as notFoundAnswer, readJson, stale as staleAnswer } from './json';

const notFound = () => notFoundAnswer('Build not found');
const stale = (current: unknown) => staleAnswer(CHANGED_ELSEWHERE, current);
const noFit = (n: BudgetNoFit) =>
	json(
		{
			message: n.reason,
			code: n.code,
			budget: n.budget,
			...(n.cheapestTotal ? { cheapestTotal: n.cheapestTotal } : {})
		},
		{ status: 422 }
	);

function buildId(event: RequestEvent): number {
	return Number(event.params.id);
}

/** GET …/sync: the three-way table, or up to date. */
export async function getSyncPlan(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const outcome = await syncPlan.syncPlan(user.id, buildId(event));
	switch (outcome.kind) {
		case 'not_found':
			return notFound();
		case 'invalid':
			return json(
				{
					message: outcome.issues._form?.[0] ?? 'This build cannot be synced.',
					issues: outcome.issues
				},
				{ status: 422 }
			);
		default:
			return json(outcome);
	}
}

/** A sync or its undo: 404, 400 with issues, 409 with the current table, or what changed. */
function changeAnswer(outcome: sync.ApplySyncOutcome | sync.UndoSyncOutcome): Response {
	if (outcome.kind === 'not_found') return notFound();
	if (outcome.kind === 'invalid') return invalid(outcome.issues);
	if (outcome.kind === 'conflict') return stale(outcome.current);
	const { kind: _kind, ...changed } = outcome;
	return json(changed);
}

/** POST …/sync: apply the reader's choices. */
export async function postSync(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, syncApplyInput);
	if (!input.ok) return input.response;
	const { version, ...choices } = input.data;
	const outcome = await sync.applySync(user.id, buildId(event), choices, version);
	return changeAnswer(outcome);
}

/** POST …/sync/undo: put back the slots and base revision of the last sync. */
export async function postUndoSync(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, syncUndoInput);
	if (!input.ok) return input.response;
	const outcome = await sync.undoLastSync(user.id, buildId(event), input.data.version);
	return changeAnswer(outcome);
}

/** POST …/within-budget: the proposed swaps (nothing is changed). */
export async function postWithinBudget(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, withinBudgetInput);
	if (!input.ok) return input.response;
	const outcome = await budget.proposeWithinBudget(user.id, buildId(event), input.data.budget);
	switch (outcome.kind) {
		case 'not_found':
			return notFound();
		case 'no_fit':
			return noFit(outcome);
		case 'proposal': {
			const { kind: _kind, ...proposal } = outcome;
			return json(proposal);
		}
	}
}

/** POST …/within-budget/apply: solve again and apply the swaps as one change; sets the budget. */
export async function postApplyWithinBudget(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, withinBudgetApplyInput);
	if (!input.ok) return input.response;
	const outcome = await budget.applyWithinBudget(
		user.id,
		buildId(event),
		input.data.budget,
		input.data.version
	);
	switch (outcome.kind) {
		case 'not_found':
			return notFound();
		case 'no_fit':
			return noFit(outcome);
		case 'conflict':
			return stale(outcome.current);
		case 'ok': {
			const { kind: _kind, ...applied } = outcome;
			return json(applied);
		}
	}
}
