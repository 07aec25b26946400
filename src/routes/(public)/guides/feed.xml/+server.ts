import { atomFeed } from '$lib/server/services/guide-feed';
import type { RequestHandler } from './$types';

/** Atom feed (RFC 4287) of the published guides, newest first. */
export const GET: RequestHandler = async ({ url }) => {
	return new Response(await atomFeed(url.origin), {
		headers: {
			'content-type': 'application/atom+xml; charset=utf-8',
			// Feed readers poll; a few minutes of caching spares the pricing work.
			'cache-control': 'public, max-age=300'
		}
	});
};
