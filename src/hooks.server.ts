import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { authHandle } from '$lib/server/auth/config';
import {
	capBodies,
	checkFormOrigin,
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
import { startInlineWorker, stopInlineWorker } from '$lib/server/mail/queue/inline';
import { startPhotoWorker, stopPhotoWorker } from '$lib/server/images/photo-worker-inline';
import { inlineWorkerWanted } from '$lib/server/mail/queue/settings';
import { startScheduler, stopScheduler } from '$lib/server/schedule';
import { isDatabaseUnavailable } from '$lib/server/db/availability';
import { readYourWrites } from '$lib/server/db/read-your-writes';
import { conditionalGuideReads } from '$lib/server/http/guide-caching';
import { openFrontDoor } from '$lib/server/http/front-door';
import { chain } from '$lib/server/http/handle-chain';
import { recordCookieWrites } from '$lib/server/http/cookie-writes';
import { conditionalListReads } from '$lib/server/http/list-caching';
import { UNAVAILABLE_MESSAGE } from '$lib/server/http/unavailable';
import { logFailure, logRequest, logShutdown, logUnexpectedError } from '$lib/server/log';
import { closeRateLimits } from '$lib/server/rate-limit';
import {
	closeConnectionsWhenStopping,
	requestsFinished,
	watchForShutdown
} from '$lib/server/shutdown';

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
	if (!dev) {
		watchForShutdown();
		// Visitors' kept answers are sent again before SvelteKit sees the request (front-door.ts).
		openFrontDoor();
	}
	// The mail queue's worker runs beside the app (MAIL_WORKER=off leaves it to `npm run worker`).
	startInlineWorker();
	// The periodic upkeep jobs run where the mail worker runs (server/schedule).
	if (inlineWorkerWanted()) startScheduler();
	// Uploaded photos are processed here, one at a time, off the request path.
	startPhotoWorker();
};

// In order, like `sequence` from @sveltejs/kit/hooks, without its tracing spans (handle-chain.ts).
export const handle = chain(
	log,
	closeConnectionsWhenStopping,
	securityHeaders,
	outageAs503,
	checkFormOrigin,
	capBodies,
	jsonOnlyApi,
	closeAuthEndpoints,
	formBodiesOnly,
	// Before authHandle: the session check re-reads the account, from the primary after a write.
	readYourWrites,
	// Before the session check: Auth.js's renewed cookie goes on kept answers too.
	recordCookieWrites,
	authHandle,
	resolveUser,
	guardAreas,
	// After resolveUser: only a visitor's answer is public and may be a 304.
	conditionalGuideReads,
	conditionalListReads
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
// With the pools closed nothing holds the event loop open, so the process exits with 0.
process.once('sveltekit:shutdown' as never, (reason: string) => {
	// Requests whose clients left are still running here (server/shutdown.ts); then the work
	// they left running after their answers.
	void requestsFinished()
		.then(() => settled())
		// The scheduler ends its job in hand; the worker finishes the message it is sending
		// and releases its claims first.
		.then(() => stopScheduler())
		.then(() => Promise.all([stopInlineWorker(), stopPhotoWorker()]))
		.then(() => Promise.all([closeDb(), closeRateLimits()]))
		.then(
			() => logShutdown(String(reason), 'closed'),
			() => logShutdown(String(reason), 'failed to close')
		);
});
