import { error } from '@sveltejs/kit';
import { contentTypeOf, isValidKey, storage } from '$lib/server/storage';
import { servable } from '$lib/server/services/photos';
import type { RequestHandler } from './$types';

/*
 * Photo files from the photo store, whichever driver is configured (docs/security.md §6):
 * our own content type by extension, never sniffed, no script context, and cached for a
 * year because a key never changes content (a new upload gets a new random key).
 */
export const GET: RequestHandler = async ({ params }) => {
	const key = params.key;
	const type = contentTypeOf(key);
	if (!isValidKey(key) || !type || !key.startsWith('photos/')) error(404, 'Not found');
	const prefix = key.split('/').slice(0, 2).join('/');
	if (!(await servable(prefix))) error(404, 'Not found');
	const object = await storage().get(key);
	if (!object) error(404, 'Not found');
	return new Response(object.body as Uint8Array<ArrayBuffer>, {
		headers: {
			'content-type': type,
			'content-length': String(object.body.byteLength),
			'x-content-type-options': 'nosniff',
			'cache-control': 'public, max-age=31536000, immutable',
			'content-security-policy': "default-src 'none'; sandbox",
			'cross-origin-resource-policy': 'same-origin'
		}
	});
};
