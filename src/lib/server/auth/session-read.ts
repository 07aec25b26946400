/*
 * A session read that failed because the account could not be looked up, remembered on the
 * request it belongs to, so resolveUser answers 503 instead of treating the person as signed
 * out (issue 12, item 6). The jwt callback runs inside Auth.js, which offers no way to pass
 * this back, so it is kept on the request's locals.
 */
import { getRequestEvent } from '$app/server';
import { logFailure } from '$lib/server/log';

export function sessionReadFailed(error: unknown): void {
	logFailure('session-read-failed', error);
	try {
		getRequestEvent().locals.sessionUnavailable = true;
	} catch {
		// Outside a request (no event): nothing to answer, and the session is left as it was.
	}
}
