/*
 * The author JSON API for guide drafts (POST /api/v1/guides, GET/PUT …/draft, POST …/submit).
 * Handlers live here so the route files stay thin and the browse route keeps its own file.
 * JSON only (the hook answers 415 to other bodies), owner only: another author's guide is a 404.
 *
 * The schemas are the guide editor's too (schemas/guide-editor.ts). A draft read with GET can
 * be sent back with PUT as it came: the read-only fields GET adds are dropped first
 * (DRAFT_READ_ONLY); any other unknown field is still refused.
 */
import { json } from '@sveltejs/kit';
import type { RequestEvent } from '@sveltejs/kit';
import {
	createGuideInput,
	saveDraftInput,
	submitInput,
	withoutReadOnly
} from '$lib/schemas/guide-editor';
import type { DRAFT_READ_ONLY, SaveDraftInput } from '$lib/schemas/guide-editor';
import { requireRole } from '$lib/server/auth/guards';
import { jsonAnswer, jsonFailure, readJson } from '$lib/server/http/answers';
import type { JsonWords } from '$lib/server/http/answers';
import * as limits from '$lib/server/rate-limit';
import { guideCreateChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequestsJson } from '$lib/server/rate-limit-response';
import * as draftEdits from '$lib/server/services/guide-draft-edits';
import * as drafts from '$lib/server/services/guide-drafts';
import type { DraftView } from '$lib/views';

const GUIDE: JsonWords = {
	notFound: 'Guide not found',
	stale: 'This guide was changed elsewhere since you opened it.'
};

/*
 * Compile-time check that GET and PUT agree: every field of the draft GET answers is either
 * an input of PUT or listed as read-only. A new DraftView field fails to compile here until
 * it is one or the other, so a GET answer can always be sent back unchanged.
 */
type Unclassified = Exclude<
	keyof DraftView,
	keyof SaveDraftInput | (typeof DRAFT_READ_ONLY.draft)[number]
>;
const everyDraftFieldClassified: [Unclassified] extends [never] ? true : Unclassified = true;
void everyDraftFieldClassified;

/** POST /api/v1/guides → 201 { slug, version } */
export async function createGuide({ request }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	const input = await readJson(request, createGuideInput);
	if (input.kind !== 'ok') return jsonFailure(input, GUIDE);
	const allowed = await limits.consumeAll(guideCreateChecks(user.id));
	if (!allowed.ok) return tooManyRequestsJson(allowed);
	const outcome = await draftEdits.createGuide(user.id, input.data);
	return jsonAnswer(outcome, GUIDE, (ok) =>
		json(
			{ slug: ok.slug, version: ok.version },
			{ status: 201, headers: { location: `/api/v1/guides/${ok.slug}/draft` } }
		)
	);
}

/** GET /api/v1/guides/[slug]/draft → the working copy with its version */
export async function getDraft({ params }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	const draft = await drafts.getDraft(user.id, params.slug ?? '');
	return draft ? json(draft) : jsonFailure({ kind: 'not_found' }, GUIDE);
}

/** PUT /api/v1/guides/[slug]/draft { version, …draft } → 200 draft | 409 { message, current } | 400 */
export async function saveDraft({ params, request }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	// Ownership first, so another author's slug answers 404 whatever the body holds.
	if (!(await drafts.getDraft(user.id, params.slug ?? '')))
		return jsonFailure({ kind: 'not_found' }, GUIDE);
	const input = await readJson(request, saveDraftInput, { prepare: withoutReadOnly });
	if (input.kind !== 'ok') return jsonFailure(input, GUIDE);
	const { version, ...draft } = input.data;
	const outcome = await draftEdits.saveDraft(user.id, params.slug ?? '', draft, version);
	return jsonAnswer(outcome, GUIDE, (ok) => json(ok.draft));
}

/** POST /api/v1/guides/[slug]/submit { version } → 200 draft (frozen) | 409 | 400 */
export async function submitDraft({ params, request, url }: RequestEvent): Promise<Response> {
	const user = requireRole('author', 'editor');
	if (!(await drafts.getDraft(user.id, params.slug ?? '')))
		return jsonFailure({ kind: 'not_found' }, GUIDE);
	const input = await readJson(request, submitInput);
	if (input.kind !== 'ok') return jsonFailure(input, GUIDE);
	const outcome = await draftEdits.submit(user.id, params.slug ?? '', input.data.version, {
		guidesUrl: new URL('/my/guides', url.origin).href
	});
	return jsonAnswer(outcome, GUIDE, (ok) => json(ok.draft));
}
