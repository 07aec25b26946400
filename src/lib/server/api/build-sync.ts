/*
 * The build sync and within-budget JSON API (issue 7):
 *   GET  /api/v1/builds/[id]/sync                 → 200 { kind: 'plan', plan } | { kind: 'up_to_date', version, lastSync }
 *   POST /api/v1/builds/[id]/sync                 { version, choices, takeAllNonConflicting, upstreamRevisionId? }
 *   POST /api/v1/builds/[id]/sync/undo            { version }
 *   POST /api/v1/builds/[id]/sync/decline         { upstreamRevisionId } → 200 { revisionNumber, baseRevisionNumber, declinedAt }
 *   POST /api/v1/builds/[id]/within-budget        { budget } → 200 proposal | 422 { message }
 *   POST /api/v1/builds/[id]/within-budget/apply  { budget, version } → 200 applied | 422 | 409
 * Owner only (anyone else's build is a 404 with no data), visitors 401, JSON only (the hook
 * answers 415 to other bodies), stale version 409 { message, current }, bad input 400
 * { message, issues } with field paths. `budget` is an amount in the build's currency
 * ("750.00") or a whole number of minor units (75000).
 *
 * The schemas are the ones the build page's form actions use (schemas/build-sync.ts).
 */
import { json } from '@sveltejs/kit';
import type { RequestEvent } from '@sveltejs/kit';
import {
	syncApplyInput,
	syncDeclineInput,
	syncUndoInput,
	withinBudgetApplyInput,
	withinBudgetInput
} from '$lib/schemas/build-sync';
import { requireUser } from '$lib/server/auth/guards';
import { jsonAnswer, jsonFailure, readJson } from '$lib/server/http/answers';
import * as budget from '$lib/server/services/build-budget';
import type { BudgetNoFit } from '$lib/views';
import * as sync from '$lib/server/services/build-sync';
import * as declines from '$lib/server/services/build-declines';
import * as syncPlan from '$lib/server/services/build-sync-plan';
import { BUILD } from './builds';

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

/** The changed counts and versions of a sync, an undo or an applied budget, without `kind`. */
function withoutKind<T extends { kind: string }>({ kind: _kind, ...rest }: T) {
	return rest;
}

function buildId(event: RequestEvent): number {
	return Number(event.params.id);
}

/** GET …/sync: the three-way table, or up to date. A build that cannot be synced is a 422. */
export async function getSyncPlan(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const outcome = await syncPlan.syncPlan(user.id, buildId(event));
	if (outcome.kind === 'invalid')
		return json(
			{
				message: outcome.issues._form?.[0] ?? 'This build cannot be synced.',
				issues: outcome.issues
			},
			{ status: 422 }
		);
	return jsonAnswer(outcome, BUILD, (ok) => json(ok));
}

/** POST …/sync: apply the reader's choices. */
export async function postSync(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, syncApplyInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const { version, ...choices } = input.data;
	const outcome = await sync.applySync(user.id, buildId(event), choices, version);
	return jsonAnswer(outcome, BUILD, (ok) => json(withoutKind(ok)));
}

/** POST …/sync/undo: put back the slots and base revision of the last sync. */
export async function postUndoSync(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, syncUndoInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const outcome = await sync.undoLastSync(user.id, buildId(event), input.data.version);
	return jsonAnswer(outcome, BUILD, (ok) => json(withoutKind(ok)));
}

/** POST …/sync/decline: record "not now" for the revision on offer; the build is unchanged. */
export async function postDeclineSync(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, syncDeclineInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const outcome = await declines.declineUpdate(user.id, buildId(event), input.data);
	return jsonAnswer(outcome, BUILD, (ok) => json(withoutKind(ok)));
}

/** POST …/within-budget: the proposed swaps (nothing is changed). */
export async function postWithinBudget(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, withinBudgetInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const outcome = await budget.proposeWithinBudget(user.id, buildId(event), input.data.budget);
	return jsonAnswer(outcome, BUILD, (ok) =>
		ok.kind === 'no_fit' ? noFit(ok) : json(withoutKind(ok))
	);
}

/** POST …/within-budget/apply: solve again and apply the swaps as one change; sets the budget. */
export async function postApplyWithinBudget(event: RequestEvent): Promise<Response> {
	const user = requireUser();
	const input = await readJson(event.request, withinBudgetApplyInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const outcome = await budget.applyWithinBudget(
		user.id,
		buildId(event),
		input.data.budget,
		input.data.version
	);
	return jsonAnswer(outcome, BUILD, (ok) =>
		ok.kind === 'no_fit' ? noFit(ok) : json(withoutKind(ok))
	);
}
