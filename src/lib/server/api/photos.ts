/*
 * The photo upload and delete endpoints (POST/DELETE under /api/v1/guides/[slug]/photos,
 * /api/v1/parts/[slug]/photos and /api/v1/builds/[id]/photos). Uploads are multipart with the
 * image in the field `file` (the hook lets multipart through on these routes only and caps
 * the body at the photo limit); deletes are JSON like the rest of the API.
 *
 * Answers: 201 with, for a guide photo, its status (id, state `processing`, progress, the
 * variant URLs it will have and `statusUrl`, also in Location; GET there reports progress
 * until `ready` or `failed`), and for a part or build photo the processed photo (id, size,
 * placeholder, variant URLs); 400 field issues; 401
 * for visitors; 404 for what is not the caller's; 409 for a refusal with a reason (quota, a
 * closed guide, a private build, a photo still live); 413 too large; 415 not a JPEG, PNG or
 * WebP; 422 unreadable or too many pixels; 429 with Retry-After; 503 when busy.
 */
import { json } from '@sveltejs/kit';
import { fieldIssues } from '$lib/schemas/issues';
import type { Issues } from '$lib/schemas/issues';
import { photoTextInput } from '$lib/schemas/photos';
import { requireUser } from '$lib/server/auth/guards';
import type { SessionUser } from '$lib/server/auth/guards';
import { jsonFailure } from '$lib/server/http/answers';
import { MAX_UPLOAD_BYTES, TOO_LARGE_MESSAGE } from '$lib/server/images/limits';
import { consumeAll } from '$lib/server/rate-limit';
import { photoUploadChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequestsJson } from '$lib/server/rate-limit-response';
import * as photos from '$lib/server/services/photos';
import type { PhotoTarget } from '$lib/server/services/photos';

const message = (text: string, status: number) => json({ message: text }, { status });
const invalid = (issues: Issues) =>
	jsonFailure({ kind: 'invalid', issues }, { notFound: 'Not found' });

/** POST: one photo. Part and build photos need alt text beside the file; guide photos get it in the gallery. */
export function uploadPhoto(request: Request, target: PhotoTarget): Promise<Response> {
	return uploadPhotoAs(requireUser(), request, target);
}

/** The upload for a signed-in `user`: counted by the limiter first, then read and handed on. */
export async function uploadPhotoAs(
	user: SessionUser,
	request: Request,
	target: PhotoTarget
): Promise<Response> {
	if (!/^multipart\/form-data\b/i.test(request.headers.get('content-type') ?? ''))
		return message('Send the photo as multipart/form-data in the field "file".', 415);
	const limited = await consumeAll(photoUploadChecks(user.id));
	if (!limited.ok)
		return tooManyRequestsJson(
			limited.retryAfterSeconds,
			'Too many photo uploads in the last hour. Please wait a little and try again.'
		);
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		return message('The body is not a readable multipart form.', 400);
	}
	const file = form.get('file');
	if (!(file instanceof File) || file.size === 0)
		return invalid({ file: ['Choose a photo to upload (the field "file").'] });
	if (file.size > MAX_UPLOAD_BYTES) return message(TOO_LARGE_MESSAGE, 413);
	let text = { caption: '', altText: '' };
	if (target.kind !== 'guide') {
		const parsed = photoTextInput.safeParse({
			caption: form.get('caption') ?? '',
			altText: form.get('altText') ?? ''
		});
		if (!parsed.success) return invalid(fieldIssues(parsed.error));
		text = parsed.data;
	}
	const bytes = new Uint8Array(await file.arrayBuffer());
	const outcome = await photos.upload(user, target, bytes, text);
	switch (outcome.kind) {
		case 'ok':
			return json(outcome.photo, { status: 201 });
		case 'accepted':
			return json(outcome.status, {
				status: 201,
				headers: { location: outcome.status.statusUrl }
			});
		case 'not_found':
			return message('Not found', 404);
		case 'conflict':
		case 'quota':
			return message(outcome.message, 409);
		case 'rejected':
			return message(outcome.message, outcome.status);
	}
}

/** DELETE: the photo and every stored variant. */
export async function deletePhoto(target: PhotoTarget, photoId: number): Promise<Response> {
	const user = requireUser();
	const outcome = await photos.remove(user, target, photoId);
	if (outcome.kind === 'not_found') return message('Photo not found', 404);
	if (outcome.kind === 'conflict') return message(outcome.message, 409);
	return new Response(null, { status: 204 });
}

/** GET: where one of the author's guide photos stands (processing with progress, ready, failed). */
export async function photoStatus(
	target: PhotoTarget & { kind: 'guide' },
	photoId: number
): Promise<Response> {
	const user = requireUser();
	const status = await photos.uploadStatus(user, target, photoId);
	if (!status) return message('Photo not found', 404);
	// Progress changes from one poll to the next: never from a cache.
	return json(status, { headers: { 'cache-control': 'no-store' } });
}
