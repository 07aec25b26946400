/**
 * The front door: a visitor's GET that this process has answered from its kept answers
 * (http/visitor-answers.ts) is answered again from Node's own request, before SvelteKit
 * builds a Request for it and runs the hooks.
 *
 * What makes such an answer correct does not change: the hook that kept it leaves here how to
 * work out its validator again (the same stamp read, list-caching.ts and guide-caching.ts),
 * and the door sends the kept bytes only while that validator is still the one they were
 * kept under, or a 304 to a matching If-None-Match. Anything else (another method, any
 * cookie, a changed or unreadable stamp, a process that is stopping) goes on to SvelteKit as
 * before. It is the saving a caching proxy in front of the app would give, for a process
 * that has none: the small JSON answers went from about 0.17 to 0.7 of a bare server's
 * requests per second (docs/benchmarks.md).
 *
 * Requests with a cookie never come through here: a session or a recent write
 * (db/read-your-writes.ts) changes who is asking or where they read, and such visitors still
 * get the kept answer through the hooks.
 *
 * The server entry (http/server-entry.js) is not part of the app's bundle, so the app hands
 * it the door through a well-known global when it starts (hooks.server.ts `init`).
 */
import type { IncomingMessage, ServerResponse } from 'node:http';
import { LRUCache } from 'lru-cache';
import { logAnswer } from '$lib/server/log';
import { asCountedRequest, isStopping } from '$lib/server/shutdown';
import { matchesIfNoneMatch } from '$lib/server/services/guide-view-cache';
import { PUBLIC_CACHING } from './caching-policy';
import { keptBytes } from './visitor-answers';

/** The global the server entry looks the door up by. */
export const FRONT_DOOR = Symbol.for('slotwise.front-door');

/** Answers the request and resolves true, or resolves false having written nothing. */
export type FrontDoor = (
	request: IncomingMessage,
	response: ServerResponse
) => false | Promise<boolean>;

interface Remembered {
	route: string;
	/** The validator the answer for this request would carry now, or null if it has none. */
	currentEtag: () => Promise<string | null>;
}

/** One entry per path, query and Accept header a visitor has been sent a kept answer for. */
const remembered = new LRUCache<string, Remembered>({ max: 20_000 });

/** The request target parsed as SvelteKit parses it: its origin followed by the raw target. */
function targetOf(raw: string): URL {
	return new URL(`http://front.door${raw}`);
}

function keyOf(url: URL, accept: string | null | undefined): string {
	return `${url.pathname}${url.search}\n${accept ?? ''}`;
}

/**
 * Called by the caching hooks once a visitor's GET has a kept answer: the same request
 * (path, query, Accept, no cookie) may then be answered at the door while `currentEtag` still
 * names that answer.
 */
export function rememberAtFrontDoor(
	request: Request,
	route: string,
	currentEtag: () => Promise<string | null>
): void {
	if (request.method !== 'GET' || request.headers.has('cookie')) return;
	remembered.set(keyOf(new URL(request.url), request.headers.get('accept')), {
		route,
		currentEtag
	});
}

export const frontDoor: FrontDoor = (request, response) => {
	const target = request.url ?? '';
	// Origin-form targets only ("/path?query"); anything else is SvelteKit's to answer.
	if (request.method !== 'GET' || !target.startsWith('/')) return false;
	if (request.headers.cookie !== undefined || isStopping()) return false;
	const url = targetOf(target);
	const entry = remembered.get(keyOf(url, request.headers.accept));
	if (!entry) return false;
	return asCountedRequest(() => answer(entry, url.pathname, request, response));
};

async function answer(
	entry: Remembered,
	path: string,
	request: IncomingMessage,
	response: ServerResponse
): Promise<boolean> {
	const started = performance.now();
	let etag: string | null;
	try {
		etag = await entry.currentEtag();
	} catch {
		// An outage or any other failure: SvelteKit answers, with its calm 503 where it is one.
		return false;
	}
	if (!etag) return false;
	let status: number;
	if (matchesIfNoneMatch(request.headers['if-none-match'] ?? null, etag)) {
		status = 304;
		response.writeHead(304, { etag, 'cache-control': PUBLIC_CACHING, vary: 'Cookie' });
		response.end();
	} else {
		const kept = keptBytes(etag);
		if (!kept) return false;
		status = 200;
		// After the server entry's baseline security headers: a page's own CSP replaces them.
		for (const [name, value] of kept.headers) response.setHeader(name, value);
		response.setHeader('content-length', kept.body.byteLength);
		response.writeHead(200);
		response.end(kept.body);
	}
	logAnswer('GET', path, entry.route, status, performance.now() - started, 'front-door');
	return true;
}

/** Hands the door to the server entry (http/server-entry.js), which looks it up per request. */
export function openFrontDoor(): void {
	(globalThis as Record<symbol, unknown>)[FRONT_DOOR] = frontDoor;
}
