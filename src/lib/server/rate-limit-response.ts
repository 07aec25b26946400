/*
 * 429 answers for a refused rate limit (rate-limit.ts), with `Retry-After` in whole seconds
 * (RFC 9110 §10.2.3, delay-seconds) as ASVS v5.0.0 2.4.1 asks. Kept apart from rate-limit.ts
 * because this file needs SvelteKit (`$app/server`) and that one must run in plain scripts.
 */
import { fail, json } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import type { ConsumeResult } from './rate-limit';

export const TOO_MANY_REQUESTS_MESSAGE = 'Too many attempts. Please wait a little and try again.';
/** When the limiter's store (MariaDB) is down: the limit failed closed, nothing was counted. */
export const STORE_DOWN_MESSAGE =
	'Slotwise cannot reach its database just now. Please try again in a minute.';

/** A refusal from `consume`/`consumeAll`, or just its wait in seconds. */
type Refusal = number | Extract<ConsumeResult, { ok: false }>;

function parts(refusal: Refusal) {
	return typeof refusal === 'number'
		? { retryAfterSeconds: refusal, storeDown: false }
		: { retryAfterSeconds: refusal.retryAfterSeconds, storeDown: refusal.storeDown === true };
}

function wholeSeconds(retryAfterSeconds: number): number {
	return Number.isFinite(retryAfterSeconds) ? Math.max(1, Math.ceil(retryAfterSeconds)) : 60;
}

/**
 * For form actions: `return tooManyRequests(result)`. Sets the header on the current
 * response (SvelteKit adds setHeaders headers to action responses too) and returns the
 * failure for `form.message`: 429, or 503 when the store was down (the database is away, so
 * nothing else would work either; issue 12, item 6).
 */
export function tooManyRequests(
	refusal: Refusal,
	message = TOO_MANY_REQUESTS_MESSAGE,
	/** More fields for the page's `form`, e.g. which section of the page answered. */
	extra: Record<string, unknown> = {}
) {
	const { retryAfterSeconds, storeDown } = parts(refusal);
	const seconds = wholeSeconds(retryAfterSeconds);
	const event = getRequestEvent();
	try {
		event.setHeaders({ 'retry-after': String(seconds) });
	} catch (e) {
		// Already set by an earlier refusal in the same request: the first value stands.
		if (!(e instanceof Error && e.message.includes('already set'))) throw e;
	}
	if (storeDown)
		return fail(503, { ...extra, message: STORE_DOWN_MESSAGE, retryAfterSeconds: seconds });
	return fail(429, { ...extra, message, retryAfterSeconds: seconds });
}

/** For `+server.ts` API routes: a JSON 429 in the API's `{ message }` error shape. */
export function tooManyRequestsJson(refusal: Refusal, message = TOO_MANY_REQUESTS_MESSAGE) {
	const { retryAfterSeconds, storeDown } = parts(refusal);
	const seconds = wholeSeconds(retryAfterSeconds);
	return json(
		{ message: storeDown ? STORE_DOWN_MESSAGE : message, retryAfterSeconds: seconds },
		{ status: storeDown ? 503 : 429, headers: { 'retry-after': String(seconds) } }
	);
}
