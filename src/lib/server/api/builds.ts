/*
 * The builds JSON API (POST /api/v1/guides/[slug]/fork, GET/PATCH /api/v1/builds/[id],
 * POST …/slots, PATCH/DELETE …/slots/[slotId], GET …/export.csv). Handlers live here so the
 * route files stay thin. JSON only (the hook answers 415 to other bodies); visitors get 401;
 * changes are the owner's only and carry the `version` last seen: a stale one is a 409 with
 * the build as it is now. Another reader's private build is a 404 with no data.
 */
import { json } from '@sveltejs/kit';
import type { RequestEvent } from '@sveltejs/kit';
import {
	addSlotInput,
	buildQuery,
	removeSlotInput,
	updateBuildInput,
	updateSlotInput
} from '$lib/schemas/build';
import { fieldIssues } from '$lib/schemas/issues';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import * as limits from '$lib/server/rate-limit';
import { forkChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequestsJson } from '$lib/server/rate-limit-response';
import * as buildEdits from '$lib/server/services/build-edits';
import * as buildExport from '$lib/server/services/build-export';
import * as buildFork from '$lib/server/services/build-fork';
import * as buildView from '$lib/server/services/build-view';
import type { MutationOutcome } from '$lib/server/services/build-edits';
import { invalid, notFound as notFoundAnswer, readJson, stale } from './json';

const notFound = () => notFoundAnswer('Build not found');
export const CHANGED_ELSEWHERE = 'This build was changed elsewhere since you opened it.';

function idOf(value: string | undefined): number {
	// The [id=id] matcher has already checked the shape.
	return Number(value ?? 0);
}

function answer(outcome: MutationOutcome): Response {
	switch (outcome.kind) {
		case 'not_found':
			return notFound();
		case 'invalid':
			return invalid(outcome.issues);
		case 'conflict':
			return stale(CHANGED_ELSEWHERE, outcome.current);
		case 'ok':
			return json(outcome.build);
	}
}

/** Parses ?key= and ?region=; an unknown region is a 400, not a silent fallback. */
function queryOf(
	url: URL
):
	| { ok: true; value: { shareToken?: string; regionCode?: string } }
	| { ok: false; response: Response } {
	const query = buildQuery.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) return { ok: false, response: invalid(fieldIssues(query.error)) };
	return { ok: true, value: { shareToken: query.data.key, regionCode: query.data.region } };
}

/** POST /api/v1/guides/[slug]/fork (body `{}` or none) → 201 { id } */
export async function forkGuide({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	// A fork takes no fields: an empty body or `{}`.
	const text = await request.text();
	if (text.trim() !== '') {
		let value: unknown;
		try {
			value = JSON.parse(text);
		} catch {
			return json({ message: 'The body is not valid JSON.' }, { status: 400 });
		}
		if (
			typeof value !== 'object' ||
			value === null ||
			Array.isArray(value) ||
			Object.keys(value).length > 0
		) {
			return invalid({ _form: ['Send an empty JSON object: a fork takes no fields.'] });
		}
	}
	const allowed = await limits.consumeAll(forkChecks(user.id));
	if (!allowed.ok) return tooManyRequestsJson(allowed);
	const outcome = await buildFork.fork(user.id, params.slug ?? '');
	if (outcome.kind === 'not_found') return json({ message: 'Guide not found' }, { status: 404 });
	return json(
		{ id: outcome.id },
		{ status: 201, headers: { location: `/api/v1/builds/${outcome.id}` } }
	);
}

/** GET /api/v1/builds/[id]?region=&key= → the build (priced in ?region= when given) */
export async function getBuild({ params, url }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const query = queryOf(url);
	if (!query.ok) return query.response;
	const view = await buildView.getBuild({ id: user.id }, idOf(params.id), query.value);
	if (!view) return notFound();
	if (query.value.regionCode && view.region.code !== query.value.regionCode)
		return invalid({ region: ['Choose a region from the list.'] });
	return json(view);
}

/** PATCH /api/v1/builds/[id] { version, title?, notes?, regionCode?, visibility?, budget?, notifyOnNewRevision? } */
export async function patchBuild({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const id = idOf(params.id);
	// Ownership first, so another reader's build answers 404 whatever the body holds.
	if (!(await buildEdits.ownsBuild(user.id, id))) return notFound();
	const input = await readJson(request, updateBuildInput);
	if (!input.ok) return input.response;
	const { version, ...patch } = input.data;
	return answer(await buildEdits.updateBuild(user.id, id, patch, version));
}

/** PATCH /api/v1/builds/[id]/slots/[slotId] { version, partId?, quantity?, priceOverride?, purchase? } */
export async function patchSlot({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	if (!(await buildEdits.ownsBuild(user.id, idOf(params.id)))) return notFound();
	const input = await readJson(request, updateSlotInput);
	if (!input.ok) return input.response;
	const { version, ...patch } = input.data;
	return answer(
		await buildEdits.updateSlot(user.id, idOf(params.id), idOf(params.slotId), patch, version)
	);
}

/** POST /api/v1/builds/[id]/slots { version, category, label, partId, quantity } → 201 build */
export async function postSlot({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	if (!(await buildEdits.ownsBuild(user.id, idOf(params.id)))) return notFound();
	const input = await readJson(request, addSlotInput);
	if (!input.ok) return input.response;
	const { version, ...slot } = input.data;
	const outcome = await buildEdits.addSlot(user.id, idOf(params.id), slot, version);
	return outcome.kind === 'ok' ? json(outcome.build, { status: 201 }) : answer(outcome);
}

/** DELETE /api/v1/builds/[id]/slots/[slotId] { version } */
export async function deleteSlot({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	if (!(await buildEdits.ownsBuild(user.id, idOf(params.id)))) return notFound();
	const input = await readJson(request, removeSlotInput);
	if (!input.ok) return input.response;
	return answer(
		await buildEdits.removeSlot(user.id, idOf(params.id), idOf(params.slotId), input.data.version)
	);
}

/**
 * GET /api/v1/builds/[id]/export.csv?region=&key= → text/csv. Same visibility as the
 * build itself (the owner; anyone for a public build; anyone with the link for an unlisted
 * one), so a shared link can be exported too; visitors included.
 */
export async function exportCsv({ params, url }: RequestEvent): Promise<Response> {
	const user = currentUser();
	const query = queryOf(url);
	if (!query.ok) return query.response;
	const id = idOf(params.id);
	const csv = await buildExport.exportCsv(user ? { id: user.id } : null, id, query.value);
	if (csv === null) return notFound();
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${buildExport.csvFilename(id)}"`,
			'cache-control': 'no-store'
		}
	});
}
