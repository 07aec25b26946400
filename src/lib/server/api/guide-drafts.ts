/*
 * The author JSON API for guide drafts (POST /api/v1/guides, GET/PUT …/draft, POST …/submit).
 * Handlers live here so the route files stay thin and the browse route keeps its own file.
 * JSON only (the hook answers 415 to other bodies), owner only: another author's guide is a 404.
 */
import { json } from '@sveltejs/kit';
import type { RequestEvent } from '@sveltejs/kit';
import { createGuideInput, saveDraftInput, submitInput } from '$lib/schemas/guide-editor';
import { requireRole } from '$lib/server/auth/guards';
import * as limits from '$lib/server/rate-limit';
import { guideCreateChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequestsJson } from '$lib/server/rate-limit-response';
import * as draftEdits from '$lib/server/services/guide-draft-edits';
import * as drafts from '$lib/server/services/guide-drafts';
import { invalid, notFound as notFoundAnswer, readJson } from './json';

const notFound = () => notFoundAnswer('Guide not found');

/** POST /api/v1/guides → 201 { slug, version } */
export async function createGuide({ request }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	const input = await readJson(request, createGuideInput);
	if (!input.ok) return input.response;
	const allowed = await limits.consumeAll(guideCreateChecks(user.id));
	if (!allowed.ok) return tooManyRequestsJson(allowed);
	const outcome = await draftEdits.createGuide(user.id, input.data);
	if (outcome.kind === 'invalid') return invalid(outcome.issues);
	return json(
		{ slug: outcome.slug, version: outcome.version },
		{ status: 201, headers: { location: `/api/v1/guides/${outcome.slug}/draft` } }
	);
}

/** GET /api/v1/guides/[slug]/draft → the working copy with its version */
export async function getDraft({ params }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	const draft = await drafts.getDraft(user.id, params.slug ?? '');
	return draft ? json(draft) : notFound();
}

/** PUT /api/v1/guides/[slug]/draft { version, …draft } → 200 draft | 409 { message, current } | 400 */
export async function saveDraft({ params, request }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	// Ownership first, so another author's slug answers 404 whatever the body holds.
	if (!(await drafts.getDraft(user.id, params.slug ?? ''))) return notFound();
	const input = await readJson(request, saveDraftInput);
	if (!input.ok) return input.response;
	const { version, ...draft } = input.data;
	const outcome = await draftEdits.saveDraft(user.id, params.slug ?? '', draft, version);
	switch (outcome.kind) {
		case 'not_found':
			return notFound();
		case 'invalid':
			return invalid(outcome.issues);
		case 'conflict':
			return json(
				{
					message: 'This guide was changed elsewhere since you opened it.',
					current: outcome.current
				},
				{ status: 409 }
			);
		case 'saved':
			return json(outcome.draft);
	}
}

/** POST /api/v1/guides/[slug]/submit { version } → 200 draft (frozen) | 409 | 400 */
export async function submitDraft({ params, request, url }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	if (!(await drafts.getDraft(user.id, params.slug ?? ''))) return notFound();
	const input = await readJson(request, submitInput);
	if (!input.ok) return input.response;
	const outcome = await draftEdits.submit(user.id, params.slug ?? '', input.data.version, {
		guidesUrl: new URL('/my/guides', url.origin).href
	});
	switch (outcome.kind) {
		case 'not_found':
			return notFound();
		case 'invalid':
			return invalid(outcome.issues);
		case 'conflict':
			return json(
				{
					message: 'This guide was changed elsewhere since you opened it.',
					current: outcome.current
				},
				{ status: 409 }
			);
		case 'submitted':
			return json(outcome.draft);
	}
}
