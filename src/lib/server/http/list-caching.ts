/**
 * HTTP caching of the lists for visitors: home, /guides and GET /api/v1/guides, the pages a
 * crowd arriving from a link reads first, and the parts catalog (/parts, GET /api/v1/parts).
 *
 * Their validator is built from counters in cache_generations, read with one primary-key
 * query per request: `guide-view` for both (prices, rates, regions, fit, hiding: every event
 * that changes a guide view), then `guide-list` for the guide lists (any write to a guide
 * row, an author's new name; models/Guide.ts and accounts.ts) or `part-catalog` for the
 * catalog (any write to a part, quote, store or photo; db/generation-hooks.ts). Plus the UTC
 * day, the route, document or data, and the query. A matching If-None-Match gets a 304, and
 * a GET this process has answered under the same validator gets the same bytes again
 * (visitor-answers.ts), so a list is made once per change, not once per visitor.
 *
 * Signed-in people pass straight through: their lists carry their own parts.
 */
import type { Handle } from '@sveltejs/kit';
import { QueryTypes } from 'sequelize';
import { sequelize } from '$lib/server/db';
import { isDatabaseUnavailable } from '$lib/server/db/availability';
import { sharedRead } from '$lib/server/db/shared-reads';
import { GUIDE_LIST, GUIDE_VIEW, PART_CATALOG } from '$lib/server/db/generation-names';
import { matchesIfNoneMatch, weakValidator } from '$lib/server/services/guide-view-cache';
import { PUBLIC_CACHING } from './caching-policy';
import { keepOutOfSharedCaches } from './guide-caching';
import { rememberAtFrontDoor } from './front-door';
import { keepIfPublic, keptAnswer, keptBytes } from './visitor-answers';

/** Each kept list's route and the counter that, with `guide-view`, says when it changes. */
export const LIST_ROUTES: ReadonlyMap<string, string> = new Map([
	['/(public)', GUIDE_LIST],
	['/(public)/guides', GUIDE_LIST],
	['/api/v1/guides', GUIDE_LIST],
	['/(public)/parts', PART_CATALOG],
	['/api/v1/parts', PART_CATALOG]
]);

/** The views' counter, the list's own and the day, as one string; concurrent visitors share the read (db/shared-reads.ts). */
const readListStamp = sharedRead(async (counter: string) => {
	const rows = await sequelize.query<{ name: string; value: number | string }>(
		'SELECT name, value FROM cache_generations WHERE name IN (:names)',
		{ type: QueryTypes.SELECT, replacements: { names: [GUIDE_VIEW, counter] } }
	);
	const value = (name: string) => String(rows.find((r) => r.name === name)?.value ?? 0);
	return JSON.stringify([
		value(GUIDE_VIEW),
		counter,
		value(counter),
		new Date().toISOString().slice(0, 10)
	]);
});

/** The validator of a visitor's list answer, from the current stamp. */
async function listEtag(counter: string, route: string, kind: string, search: string) {
	return weakValidator(['guide-list', await readListStamp(counter), route, kind, search]);
}

export const conditionalListReads: Handle = async ({ event, resolve }) => {
	const route = event.route.id ?? '';
	const counter = LIST_ROUTES.get(route);
	if (event.request.method !== 'GET' || !counter || event.locals.user) return resolve(event);
	const kind = event.isDataRequest ? 'data' : 'document';
	const search = new URL(event.request.url).search;
	const currentEtag = () => listEtag(counter, route, kind, search);
	let etag: string;
	try {
		etag = await currentEtag();
	} catch (error) {
		// An outage: the page's own load meets it and answers the calm 503.
		if (!isDatabaseUnavailable(error)) throw error;
		return resolve(event);
	}
	if (matchesIfNoneMatch(event.request.headers.get('if-none-match'), etag)) {
		return new Response(null, {
			status: 304,
			headers: { etag, 'cache-control': PUBLIC_CACHING, vary: 'Cookie' }
		});
	}
	const kept = keptAnswer(etag);
	if (kept) {
		rememberAtFrontDoor(event.request, route, currentEtag);
		return kept;
	}
	const response = await resolve(event);
	// Only a plain 200 that set no caching of its own becomes public.
	if (response.status !== 200 || response.headers.has('cache-control')) return response;
	try {
		response.headers.set('cache-control', PUBLIC_CACHING);
		response.headers.set('etag', etag);
		response.headers.set('vary', 'Cookie');
	} catch {
		return response; // immutable headers: not a page or list answer of ours
	}
	keepOutOfSharedCaches(response);
	const sent = await keepIfPublic(etag, response);
	if (keptBytes(etag)) rememberAtFrontDoor(event.request, route, currentEtag);
	return sent;
};
