import { deletePhoto } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** The owner deletes a photo of their build with every variant. */
export const DELETE: RequestHandler = ({ params }) =>
	deletePhoto({ kind: 'build', id: Number(params.id) }, Number(params.photoId));
