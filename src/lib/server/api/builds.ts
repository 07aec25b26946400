/*
 * The builds JSON API (POST /api/v1/guides/[slug]/fork, GET/PATCH /api/v1/builds/[id],
 * POST …/slots, PATCH/DELETE …/slots/[slotId], GET …/export.csv). Handlers live here so the
 * route files stay thin. JSON only (the hook answers 415 to other bodies); visitors get 401;
 * changes are the owner's only and carry the `version` last seen: a stale one is a 409 with
 * the build as it is now. Another reader's private build is a 404 with no data.
 *
 * Each operation parses with the schema the build page's form action uses too
 * (schemas/build.ts) and answers through server/http/answers.ts.
 */
import { json } from '@sveltejs/kit';
import type { RequestEvent } from '@sveltejs/kit';
import {
	addSlotInput,
	buildQuery,
	forkInput,
	removeSlotInput,
	updateBuildInput,
	updateSlotInput
} from '$lib/schemas/build';
import { parseInput } from '$lib/schemas/issues';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import { jsonAnswer, jsonFailure, readJson } from '$lib/server/http/answers';
import type { JsonWords } from '$lib/server/http/answers';
import * as limits from '$lib/server/rate-limit';
import { forkChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequestsJson } from '$lib/server/rate-limit-response';
import * as buildEdits from '$lib/server/services/build-edits';
import * as buildExport from '$lib/server/services/build-export';
import * as buildFork from '$lib/server/services/build-fork';
import * as buildView from '$lib/server/services/build-view';
import type { MutationOutcome } from '$lib/server/services/build-edits';

export const CHANGED_ELSEWHERE = 'This build was changed elsewhere since you opened it.';
/** The build API's words for the shared failures. */
export const BUILD: JsonWords = { notFound: 'Build not found', stale: CHANGED_ELSEWHERE };
const GUIDE: JsonWords = { notFound: 'Guide not found' };

function idOf(value: string | undefined): number {
	// The [id=id] matcher has already checked the shape.
	return Number(value ?? 0);
}

const buildAnswer = (outcome: MutationOutcome, status = 200) =>
	jsonAnswer(outcome, BUILD, (ok) => json(ok.build, { status }));

/** Parses ?key= and ?region=; an unknown region is a 400, not a silent fallback. */
function queryOf(url: URL) {
	const query = parseInput(buildQuery, Object.fromEntries(url.searchParams));
	if (query.kind !== 'ok') return query;
	return {
		kind: 'ok' as const,
		value: { shareToken: query.data.key, regionCode: query.data.region }
	};
}

/** POST /api/v1/guides/[slug]/fork (body `{}` or none) → 201 { id } */
export async function forkGuide({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	// The guide comes from the path; the body may add nothing to it.
	const input = await readJson(request, forkInput, {
		empty: {},
		prepare: (body) =>
			typeof body === 'object' && body !== null && !Array.isArray(body)
				? { ...body, guide: params.slug }
				: body
	});
	if (input.kind !== 'ok') return jsonFailure(input, GUIDE);
	const allowed = await limits.consumeAll(forkChecks(user.id));
	if (!allowed.ok) return tooManyRequestsJson(allowed);
	const outcome = await buildFork.fork(user.id, input.data.guide);
	return jsonAnswer(outcome, GUIDE, (ok) =>
		json({ id: ok.id }, { status: 201, headers: { location: `/api/v1/builds/${ok.id}` } })
	);
}

/** GET /api/v1/builds/[id]?region=&key= → the build (priced in ?region= when given) */
export async function getBuild({ params, url }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const query = queryOf(url);
	if (query.kind !== 'ok') return jsonFailure(query, BUILD);
	const view = await buildView.getBuild({ id: user.id }, idOf(params.id), query.value);
	if (!view) return jsonFailure({ kind: 'not_found' }, BUILD);
	if (query.value.regionCode && view.region.code !== query.value.regionCode)
		return jsonFailure(
			{ kind: 'invalid', issues: { region: ['Choose a region from the list.'] } },
			BUILD
		);
	return json(view);
}

/** PATCH /api/v1/builds/[id] { version, title?, notes?, regionCode?, visibility?, budget?, notifyOnNewRevision? } */
export async function patchBuild({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const id = idOf(params.id);
	// Ownership first, so another reader's build answers 404 whatever the body holds.
	if (!(await buildEdits.ownsBuild(user.id, id))) return jsonFailure({ kind: 'not_found' }, BUILD);
	const input = await readJson(request, updateBuildInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const { version, ...patch } = input.data;
	return buildAnswer(await buildEdits.updateBuild(user.id, id, patch, version));
}

/** PATCH /api/v1/builds/[id]/slots/[slotId] { version, partId?, quantity?, priceOverride?, purchase? } */
export async function patchSlot({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const id = idOf(params.id);
	if (!(await buildEdits.ownsBuild(user.id, id))) return jsonFailure({ kind: 'not_found' }, BUILD);
	const input = await readJson(request, updateSlotInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const { version, ...patch } = input.data;
	return buildAnswer(await buildEdits.updateSlot(user.id, id, idOf(params.slotId), patch, version));
}

/** POST /api/v1/builds/[id]/slots { version, category, label, partId, quantity } → 201 build */
export async function postSlot({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const id = idOf(params.id);
	if (!(await buildEdits.ownsBuild(user.id, id))) return jsonFailure({ kind: 'not_found' }, BUILD);
	const input = await readJson(request, addSlotInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	const { version, ...slot } = input.data;
	return buildAnswer(await buildEdits.addSlot(user.id, id, slot, version), 201);
}

/** DELETE /api/v1/builds/[id]/slots/[slotId] { version } */
export async function deleteSlot({ params, request }: RequestEvent): Promise<Response> {
	const user = requireUser();
	const id = idOf(params.id);
	if (!(await buildEdits.ownsBuild(user.id, id))) return jsonFailure({ kind: 'not_found' }, BUILD);
	const input = await readJson(request, removeSlotInput);
	if (input.kind !== 'ok') return jsonFailure(input, BUILD);
	return buildAnswer(
		await buildEdits.removeSlot(user.id, id, idOf(params.slotId), input.data.version)
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
	if (query.kind !== 'ok') return jsonFailure(query, BUILD);
	const id = idOf(params.id);
	const csv = await buildExport.exportCsv(user ? { id: user.id } : null, id, query.value);
	if (csv === null) return jsonFailure({ kind: 'not_found' }, BUILD);
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${buildExport.csvFilename(id)}"`,
			'cache-control': 'no-store'
		}
	});
}
