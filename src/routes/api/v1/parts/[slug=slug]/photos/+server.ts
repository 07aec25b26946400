import { uploadPhoto } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** Editors add a photo to a catalog part (multipart: `file`, `altText`, optional `caption`). */
export const POST: RequestHandler = ({ params, request }) =>
	uploadPhoto(request, { kind: 'part', slug: params.slug });
