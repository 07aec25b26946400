/*
 * One-line JSON logs on stdout. Values are JSON-encoded, so CR/LF in a path cannot
 * forge a log line; query strings are dropped because they may carry tokens.
 */
import type { RequestEvent } from '@sveltejs/kit';

const quiet = process.env.LOG_LEVEL === 'silent';

export function logRequest(event: RequestEvent, status: number, ms: number) {
	logAnswer(event.request.method, event.url.pathname, event.route.id, status, ms);
}

/**
 * One request's line; `via` names where an answer sent before SvelteKit saw the request
 * came from (`front-door`: http/front-door.ts).
 */
export function logAnswer(
	method: string,
	path: string,
	route: string | null,
	status: number,
	ms: number,
	via?: string
) {
	if (quiet) return;
	console.log(
		JSON.stringify({
			t: new Date().toISOString(),
			kind: 'request',
			method,
			path,
			route,
			status,
			ms: Math.round(ms),
			...(via ? { via } : {})
		})
	);
}

export function logUnexpectedError(errorId: string, event: RequestEvent, error: unknown) {
	console.error(
		JSON.stringify({
			t: new Date().toISOString(),
			kind: 'error',
			errorId,
			method: event.request.method,
			path: event.url.pathname,
			error:
				error instanceof Error
					? { name: error.name, message: error.message, stack: error.stack }
					: String(error)
		})
	);
}

/**
 * One line for an expected event worth counting, such as a refused password: no stack
 * trace, no personal data (docs/security.md §1, 16.3.x).
 */
export function logEvent(kind: string, fields: Record<string, string | number | boolean> = {}) {
	if (quiet) return;
	console.log(JSON.stringify({ t: new Date().toISOString(), kind, ...fields }));
}

/** One line for a failure outside a request (a mail sent after the answer, an Auth.js error). */
export function logFailure(kind: string, error: unknown, fields: Record<string, string> = {}) {
	console.error(
		JSON.stringify({
			t: new Date().toISOString(),
			kind,
			...fields,
			error:
				error instanceof Error
					? { name: error.name, message: error.message, stack: error.stack }
					: String(error)
		})
	);
}

/** The last line a process writes on SIGTERM/SIGINT: in-flight requests are done and its pools closed. */
export function logShutdown(reason: string, pools: 'closed' | 'failed to close') {
	if (quiet) return;
	console.log(JSON.stringify({ t: new Date().toISOString(), kind: 'shutdown', reason, pools }));
}
