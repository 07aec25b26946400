/*
 * The request pipeline's security pieces, composed in src/hooks.server.ts.
 */
import { dev } from '$app/environment';
import { error, json, redirect } from '@sveltejs/kit';
import { stringify } from 'devalue';
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { withCappedBody } from '$lib/server/http/capped-body';
import { baselineHeaders } from '$lib/server/http/security-headers.js';
import { UNAVAILABLE_HEADERS, unavailableResponse, wantsJson } from '$lib/server/http/unavailable';
import { secureCookies } from './cookies';
import { readSession } from './sign-in';
import { TOO_LARGE_MESSAGE, UPLOAD_BODY_LIMIT_BYTES } from '$lib/server/images/limits';
import {
	CSV_TOO_LARGE_MESSAGE,
	IMPORT_BODY_LIMIT_BYTES
} from '$lib/server/services/catalog-csv-limits';

/**
 * Auth.js answers every /auth/* path itself. Only what a browser needs directly stays
 * open: the session read, the sign-in link callback and Auth.js's error page. Sign-in,
 * sign-up and sign-out go through our form actions, where validation and rate limits run.
 */
const OPEN_AUTH_PATHS = [
	/^\/auth\/session$/,
	/^\/auth\/callback\/nodemailer$/,
	/^\/auth\/error$/,
	/^\/auth\/verify-request$/
];

export const closeAuthEndpoints: Handle = ({ event, resolve }) => {
	const { pathname } = event.url;
	if (pathname.startsWith('/auth/')) {
		const open = event.request.method === 'GET' && OPEN_AUTH_PATHS.some((p) => p.test(pathname));
		if (!open) error(404, 'Not found');
	}
	return resolve(event);
};

/** Fills locals.user from the session; the jwt callback has re-checked it against the database. */
export const resolveUser: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	const session = await readSession(event);
	// The database could not confirm the session: answer 503 and leave the cookie alone,
	// rather than go on as a visitor (issue 12, item 6).
	if (event.locals.sessionUnavailable) return unavailableResponse(event);
	const user = session?.user;
	if (user?.id)
		event.locals.user = {
			id: user.id,
			email: user.email,
			name: user.name ?? null,
			role: user.role
		};
	return resolve(event);
};

type Area = 'account' | 'author' | 'editor' | 'admin';

/** Roles allowed in each route group besides admin, who may go everywhere. */
const AREA_ROLES: Record<Area, readonly string[]> = {
	account: ['reader', 'author', 'editor'],
	author: ['author', 'editor'],
	editor: ['editor'],
	admin: []
};

function areaOf(routeId: string): Area | null {
	const match = /^\/\((account|author|editor|admin)\)/.exec(routeId);
	return match ? (match[1] as Area) : null;
}

/**
 * Whole areas by route group: (account) needs any signed-in user, (author) an author or
 * editor, (editor) an editor, (admin) an admin. Loads and actions check again themselves.
 */
export const guardAreas: Handle = ({ event, resolve }) => {
	const user = event.locals.user;
	const area = areaOf(event.route.id ?? '');
	if (area) {
		if (!user) {
			if (event.request.method !== 'GET') error(401, 'Sign in first');
			redirect(
				303,
				`/signin?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`
			);
		}
		const allowed = user.role === 'admin' || AREA_ROLES[area].includes(user.role);
		if (!allowed) error(403, 'You do not have access to this page');
	}
	return resolve(event);
};

const BODY_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Bodies above this need a route that expects them (BODY_SIZE_LIMIT is raised for uploads). */
export const DEFAULT_BODY_LIMIT_BYTES = 512 * 1024;

/**
 * Photo uploads (docs/security.md §6): multipart bodies up to the photo limit. SvelteKit's
 * CSRF origin check covers multipart/form-data, so these may take it under /api/.
 */
const UPLOAD_ROUTES = [
	/^\/api\/v1\/guides\/\[slug=slug\]\/photos$/,
	/^\/api\/v1\/parts\/\[slug=slug\]\/photos$/,
	/^\/api\/v1\/builds\/\[id=id\]\/photos$/
];
const isUploadRoute = (event: RequestEvent) =>
	UPLOAD_ROUTES.some((r) => r.test(event.route.id ?? ''));
const IMPORT_ROUTE = '/(editor)/editor/parts/import';

type BodyCap = { limit: number; refuse: (request: Request) => Response };

const tooLarge = (): Response =>
	new Response('Payload too large', { status: 413, headers: { connection: 'close' } });

/** The import's refusal as its own form gives it: the file field's message (use:enhance reads the failure). */
function csvTooLarge(request: Request): Response {
	const headers = { connection: 'close' };
	if (request.headers.has('x-sveltekit-action')) {
		const data = stringify({ issues: { file: [CSV_TOO_LARGE_MESSAGE] } });
		return json({ type: 'failure', status: 413, data }, { status: 413, headers });
	}
	return new Response(CSV_TOO_LARGE_MESSAGE, {
		status: 413,
		headers: { ...headers, 'content-type': 'text/plain; charset=utf-8' }
	});
}

function bodyCapOf(event: RequestEvent): BodyCap {
	if (isUploadRoute(event))
		return {
			limit: UPLOAD_BODY_LIMIT_BYTES,
			refuse: () => json({ message: TOO_LARGE_MESSAGE }, { status: 413 })
		};
	if (event.route.id === IMPORT_ROUTE)
		return { limit: IMPORT_BODY_LIMIT_BYTES, refuse: csvTooLarge };
	return { limit: DEFAULT_BODY_LIMIT_BYTES, refuse: tooLarge };
}

/**
 * adapter-node's BODY_SIZE_LIMIT applies to every route, so it is raised for photo uploads
 * alone, and each route is held to its own cap here: photo uploads to the photo limit, the
 * editors' CSV import to 2 MB, everything else to 512 KB. From the Content-Length when the
 * body states one, else while reading it (http/capped-body.ts).
 */
export const capBodies: Handle = async ({ event, resolve }) => {
	const { limit, refuse } = bodyCapOf(event);
	const length = Number(event.request.headers.get('content-length') ?? 0);
	if (length > limit) return refuse(event.request);
	let capped: Request | null;
	try {
		capped = await withCappedBody(event.request, limit);
	} catch {
		// The client broke off while sending: nothing was read, so nothing is done.
		return new Response('The request body could not be read', { status: 400 });
	}
	if (!capped) return refuse(event.request);
	event.request = capped;
	return resolve(event);
};

/**
 * SvelteKit's CSRF check covers only form content types, so JSON API routes refuse
 * everything else: a cross-site form cannot post JSON without a CORS preflight.
 */
export const jsonOnlyApi: Handle = ({ event, resolve }) => {
	if (event.url.pathname.startsWith('/api/') && BODY_METHODS.has(event.request.method)) {
		const type = event.request.headers.get('content-type') ?? '';
		if (isUploadRoute(event) && /^multipart\/form-data\b/i.test(type)) return resolve(event);
		if (!/^application\/json\b/i.test(type)) {
			return json(
				{ message: 'Send a JSON body (Content-Type: application/json).' },
				{ status: 415 }
			);
		}
	}
	return resolve(event);
};

/**
 * The body types a cross-site page can send without a CORS preflight, as SvelteKit 2's own
 * check lists them (is_form_content_type in @sveltejs/kit's utils/http.js, including its
 * binary form type), read the way it reads them: media type before any `;`, trimmed,
 * lower-cased, compared exactly.
 */
const CROSS_SITE_TYPES = new Set([
	'application/x-www-form-urlencoded',
	'multipart/form-data',
	'text/plain',
	'application/x-sveltekit-formdata'
]);
const mediaType = (request: Request) =>
	(request.headers.get('content-type') ?? '').split(';', 1)[0]?.trim().toLowerCase() ?? '';

/** The one route whose POST may come without our Origin (see `isOneClickUnsubscribe`). */
const ONE_CLICK_ROUTE = '/(public)/newsletter/unsubscribe';

/**
 * RFC 8058 §3.1 (docs/sources.md 12): a mail provider sends the one-click unsubscribe POST
 * itself, with no session and no Origin header, so SvelteKit's origin check would refuse
 * the very request the List-Unsubscribe-Post header announces. Exempt is exactly that
 * request: POST to this one route with a form body whose only field is
 * `List-Unsubscribe=One-Click` (the route checks it again with zod). It can do nothing but
 * end the subscription its signed, expiring token names, which anyone holding the link can
 * do anyway, so a forged cross-site form gains nothing. Anything else sent to the route,
 * or any other body, meets the same 403 as every other form POST.
 */
async function isOneClickUnsubscribe(event: RequestEvent): Promise<boolean> {
	const { request } = event;
	if (request.method !== 'POST' || event.route.id !== ONE_CLICK_ROUTE) return false;
	const type = mediaType(request);
	// RFC 8058 §3.1: multipart/form-data, or application/x-www-form-urlencoded.
	if (type !== 'multipart/form-data' && type !== 'application/x-www-form-urlencoded') return false;
	try {
		const [only, ...more] = [...(await request.clone().formData())];
		return more.length === 0 && only?.[0] === 'List-Unsubscribe' && only[1] === 'One-Click';
	} catch {
		return false;
	}
}

/**
 * SvelteKit's CSRF check, kept here so the one-click unsubscribe can be exempted
 * (svelte.config.js trusts every origin, which turns Kit's check off; Kit has no per-route
 * exemption). Otherwise the same rule and answer as Kit's: a body of a type a cross-site
 * form can send, with POST, PUT, PATCH or DELETE, whose Origin is not ours (or missing), gets
 * 403. Like Kit's, it runs in production builds only (the dev server's origin is not the
 * configured one). tests/e2e/security.e2e.ts posts to every form action and form-taking
 * endpoint cross-site and without an Origin.
 */
export const checkFormOrigin: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	if (
		!dev &&
		BODY_METHODS.has(request.method) &&
		CROSS_SITE_TYPES.has(mediaType(request)) &&
		request.headers.get('origin') !== url.origin &&
		!(await isOneClickUnsubscribe(event))
	) {
		const message = `Cross-site ${request.method} form submissions are forbidden`;
		if (request.headers.get('accept') === 'application/json')
			return json({ message }, { status: 403 });
		return new Response(message, {
			status: 403,
			headers: { 'content-type': 'text/plain;charset=UTF-8' }
		});
	}
	return resolve(event);
};

const FORM_BODY_TYPES = /^(?:application\/x-www-form-urlencoded|multipart\/form-data)\s*(?:;|$)/i;

/** A refused body, in the shape `use:enhance` reads (JSON) or as plain text for anything else. */
function refusedBody(request: Request, status: 400 | 415, message: string): Response {
	const accept = request.headers.get('accept') ?? '';
	if (request.headers.has('x-sveltekit-action') || /application\/json/i.test(accept))
		return json({ type: 'error', status, error: { message } }, { status });
	return new Response(message, {
		status,
		headers: { 'content-type': 'text/plain; charset=utf-8' }
	});
}

/**
 * Form actions read `request.formData()`, which throws for any other body type, and
 * SvelteKit answered that with a 500 (issue 12, item 11). So every POST outside /api/ (only
 * form actions take one) must be form data that parses: any other type is a 415, a form body
 * that cannot be read a 400, before an action runs. The parse works on a copy, so the action
 * still reads the body itself.
 */
export const formBodiesOnly: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	if (request.method !== 'POST' || url.pathname.startsWith('/api/')) return resolve(event);
	if (!FORM_BODY_TYPES.test(request.headers.get('content-type') ?? '')) {
		return refusedBody(
			request,
			415,
			'Send the form as application/x-www-form-urlencoded or multipart/form-data.'
		);
	}
	try {
		await request.clone().formData();
	} catch {
		return refusedBody(request, 400, 'The form data could not be read.');
	}
	return resolve(event);
};

/**
 * The security headers on everything that passes through the hooks (the server entry sets
 * the same ones on what does not: src/lib/server/http/security-headers.js). A page keeps the
 * hash-based CSP SvelteKit gave it; HSTS follows the configured origin, like the cookies.
 */
export const securityHeaders: Handle = async ({ event, resolve }) => {
	let response = await resolve(event);
	// Redirects made with Response.redirect() (Auth.js does) have immutable headers.
	try {
		response.headers.set('x-content-type-options', 'nosniff');
	} catch {
		response = new Response(response.body, response);
	}
	const headers = response.headers;
	for (const [name, value] of Object.entries(baselineHeaders({ https: secureCookies() }))) {
		// A 304's headers replace the stored page's (RFC 9111 §4.3.4): it must not bring the
		// baseline policy, which would block the page's scripts (http/server-entry.js).
		if (name === 'content-security-policy' && (headers.has(name) || response.status === 304))
			continue;
		headers.set(name, value);
	}
	if (event.locals.user && !headers.has('cache-control')) headers.set('cache-control', 'no-store');
	return response;
};

/**
 * A request that failed because the database could not be reached (handleError marks it)
 * answers 503 with Retry-After instead of 500: the page or JSON body is the calm one
 * handleError gave it (issue 12, item 6; docs/security.md §7).
 */
export const outageAs503: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (!event.locals.databaseUnavailable || response.status !== 500) return response;
	// The API answers JSON whatever the client accepts; pages keep the error page rendered.
	if (wantsJson(event)) return unavailableResponse(event);
	const headers = new Headers(response.headers);
	for (const [name, value] of Object.entries(UNAVAILABLE_HEADERS)) headers.set(name, value);
	return new Response(response.body, { status: 503, headers });
};
