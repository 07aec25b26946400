import { uploadPhoto } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** The owner adds a photo of their finished, public build (multipart: `file`, `altText`, optional `caption`). */
export const POST: RequestHandler = ({ params, request }) =>
	uploadPhoto(request, { kind: 'build', id: Number(params.id) });
