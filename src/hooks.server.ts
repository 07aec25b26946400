import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { dev } from '$app/environment';
import { authHandle } from '$lib/server/auth/config';
import {
	capBodies,
	closeAuthEndpoints,
	guardAreas,
	jsonOnlyApi,
	resolveUser,
	securityHeaders
} from '$lib/server/auth/hooks';
import { closeDb } from '$lib/server/db';
import { readYourWrites } from '$lib/server/db/read-your-writes';
import { logRequest, logShutdown, logUnexpectedError } from '$lib/server/log';
import { closeRateLimits } from '$lib/server/rate-limit';
import { closeConnectionsWhenStopping, watchForShutdown } from '$lib/server/shutdown';

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
	if (!dev) watchForShutdown();
};

export const handle = sequence(
	log,
	closeConnectionsWhenStopping,
	securityHeaders,
	capBodies,
	jsonOnlyApi,
	closeAuthEndpoints,
	// Before authHandle: the session check re-reads the account, from the primary after a write.
	readYourWrites,
	authHandle,
	resolveUser,
	guardAreas
);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status === 404) return { message };
	const errorId = crypto.randomUUID();
	logUnexpectedError(errorId, event, error);
	// Never the stack or SQL: only a generic message and the reference.
	return { message: 'Something went wrong on our side.', errorId };
};

// adapter-node emits this on SIGINT/SIGTERM after in-flight requests finish. With the pools
// closed nothing holds the event loop open, so the process ends with exit code 0.
process.once('sveltekit:shutdown' as never, (reason: string) => {
	void Promise.all([closeDb(), closeRateLimits()]).then(
		() => logShutdown(String(reason), 'closed'),
		() => logShutdown(String(reason), 'failed to close')
	);
});
