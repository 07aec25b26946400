import { deletePhoto } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** Editors delete a part photo with every variant. */
export const DELETE: RequestHandler = ({ params }) =>
	deletePhoto({ kind: 'part', slug: params.slug }, Number(params.id));
