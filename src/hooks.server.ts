import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from '$lib/server/auth/config';
import {
	capBodies,
	closeAuthEndpoints,
	formBodiesOnly,
	guardAreas,
	jsonOnlyApi,
	outageAs503,
	resolveUser,
	securityHeaders
} from '$lib/server/auth/hooks';
import { settled } from '$lib/server/background';
import { closeDb } from '$lib/server/db';
import { isDatabaseUnavailable } from '$lib/server/db/availability';
import { UNAVAILABLE_MESSAGE } from '$lib/server/http/unavailable';
import { logFailure, logRequest, logUnexpectedError } from '$lib/server/log';
import { closeRateLimits } from '$lib/server/rate-limit';

const log: Handle = async ({ event, resolve }) => {
	const started = performance.now();
	const response = await resolve(event);
	logRequest(event, response.status, performance.now() - started);
	return response;
};

/** Refuse to start without a usable Auth.js secret rather than fail every request later. */
export const init: ServerInit = () => {
	if ((process.env.AUTH_SECRET ?? '').length < 32) {
		throw new Error(
			'AUTH_SECRET must be set to at least 32 random characters (npm start makes one for development).'
		);
	}
};

export const handle = sequence(
	log,
	securityHeaders,
	outageAs503,
	capBodies,
	jsonOnlyApi,
	closeAuthEndpoints,
	formBodiesOnly,
	authHandle,
	resolveUser,
	guardAreas
);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status === 404) return { message };
	if (isDatabaseUnavailable(error)) {
		// Expected during an outage: one line, a calm message, and a 503 (outageAs503).
		event.locals.databaseUnavailable = true;
		logFailure('database-unavailable', error, { path: event.url.pathname });
		return { message: UNAVAILABLE_MESSAGE, unavailable: true };
	}
	const errorId = crypto.randomUUID();
	logUnexpectedError(errorId, event, error);
	// Never the stack or SQL: only a generic message and the reference.
	return { message: 'Something went wrong on our side.', errorId };
};

// adapter-node emits this on SIGINT/SIGTERM after in-flight requests finish; mail and other
// work left running after an answer (server/background.ts) finishes before the pools close.
process.once('sveltekit:shutdown' as never, () => {
	void settled().finally(() => {
		void closeDb();
		void closeRateLimits();
	});
});
