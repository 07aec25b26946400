import { uploadPhoto } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** Upload a photo to the author's own guide (multipart, field `file`) → 201 with its variants. */
export const POST: RequestHandler = ({ params, request }) =>
	uploadPhoto(request, { kind: 'guide', slug: params.slug });
