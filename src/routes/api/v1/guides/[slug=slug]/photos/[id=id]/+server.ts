import { deletePhoto, photoStatus } from '$lib/server/api/photos';
import type { RequestHandler } from './$types';

/** Delete one of the guide's photos with every variant (refused while a live or pending revision shows it). */
export const DELETE: RequestHandler = ({ params }) =>
	deletePhoto({ kind: 'guide', slug: params.slug }, Number(params.id));

/** Where an upload stands: processing (files made of files to make), ready with the photo, or failed with the reason. */
export const GET: RequestHandler = ({ params }) =>
	photoStatus({ kind: 'guide', slug: params.slug }, Number(params.id));
