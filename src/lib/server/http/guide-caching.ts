/**
 * HTTP caching of the guide page and GET /api/v1/guides/[slug]/pricing, so a reverse proxy
 * or CDN in front of several app processes can serve them (docs/architecture.md, "Caching").
 *
 * - Visitors (no session): a weak ETag from the guide's stamp (guide-view-cache.ts) and
 *   `public` caching. A matching If-None-Match is answered 304 here, before the page is
 *   loaded or rendered, at the cost of the one stamp read the load would make anyway (it is
 *   handed on in locals). A GET whose ETag this process has answered before gets the same
 *   bytes again without a render (http/visitor-answers.ts).
 * - Signed-in people: `private, no-store` and no ETag. Their page carries their own parts
 *   (report form, fork panel, tip prompt), which no shared cache may keep or hand on. This
 *   process keeps it for readers who would get the same bytes (http/signed-in-answers.ts).
 * - Every cacheable answer says `Vary: Cookie`, so a cache never gives a visitor's copy to
 *   someone who sends a session cookie (nor the reverse), and any answer that sets a cookie
 *   is turned private, whatever else said it was public.
 *
 * The page also shows things outside the stamp: forks of the guide, its gallery, tip notes,
 * part photos. They enter its ETag through a one-minute period, so a shared cache sees them
 * change within `max-age` plus one minute; prices and fit never wait for that (the stamp).
 */
import type { Handle } from '@sveltejs/kit';
import { isDatabaseUnavailable } from '$lib/server/db/availability';
import {
	matchesIfNoneMatch,
	readStamp,
	validatorOf,
	type GuideStamp
} from '$lib/server/services/guide-view-cache';
import { PRIVATE_CACHING, PUBLIC_CACHING } from './caching-policy';
import { signedInAnswer } from './signed-in-answers';
import { rememberAtFrontDoor } from './front-door';
import { keepIfPublic, keptAnswer, keptBytes } from './visitor-answers';

export const GUIDE_PAGE_ROUTE = '/(public)/guides/[slug=slug]';
export const PRICING_ROUTE = '/api/v1/guides/[slug=slug]/pricing';

/** The page's parts outside the stamp (forks, gallery, tip notes) change the ETag this often. */
const PAGE_EXTRAS_PERIOD_MS = 60_000;

/** A visitor's validator for this guide answer, from `stamp` (null: the answer has none). */
function visitorEtag(
	stamp: GuideStamp | null,
	route: string,
	kind: 'data' | 'document',
	search: string
): string | null {
	if (!stamp || stamp.hidden) return null;
	return validatorOf(stamp, [
		route,
		kind,
		// The request's own query: SvelteKit takes x-sveltekit-invalidated (which loads a
		// data request re-runs) out of event.url, and it changes what the answer holds.
		search,
		route === GUIDE_PAGE_ROUTE ? String(Math.floor(Date.now() / PAGE_EXTRAS_PERIOD_MS)) : ''
	]);
}

/**
 * Reads a visitor's validator for this answer afresh (the front door's check). Made out here
 * so the closure the door keeps holds these four strings, not the request's whole scope.
 */
function visitorEtagReader(
	slug: string,
	route: string,
	kind: 'data' | 'document',
	search: string
): () => Promise<string | null> {
	return async () =>
		visitorEtag(await readStamp(slug, new Date(), { shared: true }), route, kind, search);
}

export const conditionalGuideReads: Handle = async ({ event, resolve }) => {
	const route = event.route.id;
	const method = event.request.method;
	if (
		(method !== 'GET' && method !== 'HEAD') ||
		(route !== GUIDE_PAGE_ROUTE && route !== PRICING_ROUTE)
	)
		return resolve(event);
	const slug = event.params.slug ?? '';
	let stamp: Awaited<ReturnType<typeof readStamp>>;
	try {
		stamp = await readStamp(slug, new Date(), {
			shared: !event.locals.user
		});
	} catch (error) {
		// MariaDB is down: no validator to offer. The page's own load meets the same outage
		// and answers the calm 503 (handleError and outageAs503); a hook that threw here
		// would have turned it into a bare 500.
		if (!isDatabaseUnavailable(error)) throw error;
		return resolve(event);
	}
	event.locals.guideStamp = stamp;
	const kind = event.isDataRequest ? 'data' : 'document';
	const search = new URL(event.request.url).search;
	const currentEtag = visitorEtagReader(slug, route, kind, search);
	const etag = event.locals.user ? null : visitorEtag(stamp, route, kind, search);
	if (etag) {
		event.locals.guideEtag = etag;
		if (matchesIfNoneMatch(event.request.headers.get('if-none-match'), etag)) {
			return new Response(null, {
				status: 304,
				headers: { etag, 'cache-control': PUBLIC_CACHING, vary: 'Cookie' }
			});
		}
	}
	if (etag && method === 'GET') {
		const kept = keptAnswer(etag);
		if (kept) {
			rememberAtFrontDoor(event.request, route, currentEtag);
			return kept;
		}
	}
	if (event.locals.user) {
		// The guide page only: the pricing API answers signed-in callers from the cached view.
		return stamp && route === GUIDE_PAGE_ROUTE
			? signedInAnswer(event, stamp, async () => resolve(event))
			: resolve(event);
	}
	const response = await resolve(event);
	keepOutOfSharedCaches(response);
	if (!etag || method !== 'GET') return response;
	const sent = await keepIfPublic(etag, response);
	if (keptBytes(etag)) rememberAtFrontDoor(event.request, route, currentEtag);
	return sent;
};

/**
 * Auth.js's session check sets its callback-url cookie on every visitor's answer: the
 * site's own origin, the same for everyone, and set again by the sign-in pages that use
 * it. It is left off a public answer (shared caches do not store answers that set
 * cookies). Any other cookie makes the answer private: it may belong to one person.
 */
export function keepOutOfSharedCaches(response: Response): void {
	const cookies = response.headers.getSetCookie();
	if (cookies.length === 0 || response.headers.get('cache-control') !== PUBLIC_CACHING) return;
	const others = cookies.filter((c) => !/^(__Secure-)?authjs\.callback-url=/.test(c));
	try {
		response.headers.delete('set-cookie');
		for (const cookie of others) response.headers.append('set-cookie', cookie);
		if (others.length > 0) {
			response.headers.set('cache-control', PRIVATE_CACHING);
			response.headers.delete('etag');
		}
	} catch {
		// Immutable headers (a redirect): nothing cacheable to correct.
	}
}

/**
 * The caching headers a guide page load or pricing answer sets (through `setHeaders`):
 * public with the ETag the hook computed for a visitor, private for anyone signed in.
 */
export function cachingHeaders(locals: App.Locals): Record<string, string> {
	if (locals.user) return { 'cache-control': PRIVATE_CACHING };
	if (!locals.guideEtag) return {};
	return { etag: locals.guideEtag, 'cache-control': PUBLIC_CACHING, vary: 'Cookie' };
}
