/*
 * 429 answers for a refused rate limit (rate-limit.ts), with `Retry-After` in whole seconds
 * (RFC 9110 §10.2.3, delay-seconds) as ASVS v5.0.0 2.4.1 asks. Kept apart from rate-limit.ts
 * because this file needs SvelteKit (`$app/server`) and that one must run in plain scripts.
 */
import { fail, json } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';

export const TOO_MANY_REQUESTS_MESSAGE = 'Too many attempts. Please wait a little and try again.';

function wholeSeconds(retryAfterSeconds: number): number {
	return Number.isFinite(retryAfterSeconds) ? Math.max(1, Math.ceil(retryAfterSeconds)) : 60;
}

/**
 * For form actions: `return tooManyRequests(result.retryAfterSeconds)`. Sets the header on the
 * current response (SvelteKit adds setHeaders headers to action responses too) and returns
 * the failure for `form.message`.
 */
export function tooManyRequests(retryAfterSeconds: number, message = TOO_MANY_REQUESTS_MESSAGE) {
	const seconds = wholeSeconds(retryAfterSeconds);
	const event = getRequestEvent();
	try {
		event.setHeaders({ 'retry-after': String(seconds) });
	} catch (e) {
		// Already set by an earlier refusal in the same request: the first value stands.
		if (!(e instanceof Error && e.message.includes('already set'))) throw e;
	}
	return fail(429, { message, retryAfterSeconds: seconds });
}

/** For `+server.ts` API routes: a JSON 429 in the API's `{ message }` error shape. */
export function tooManyRequestsJson(
	retryAfterSeconds: number,
	message = TOO_MANY_REQUESTS_MESSAGE
) {
	const seconds = wholeSeconds(retryAfterSeconds);
	return json(
		{ message, retryAfterSeconds: seconds },
		{ status: 429, headers: { 'retry-after': String(seconds) } }
	);
}
