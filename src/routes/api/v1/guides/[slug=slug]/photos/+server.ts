import { uploadPhoto } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** Upload a photo to the author's own guide (multipart, field `file`) → 201 with its status; the variants are made in the background. */
export const POST: RequestHandler = ({ params, request }) =>
	uploadPhoto(request, { kind: 'guide', slug: params.slug });
