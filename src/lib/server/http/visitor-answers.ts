/**
 * Visitors' guide pages and pricing answers, kept in this process by their ETag.
 *
 * The ETag (http/guide-caching.ts) already names everything such an answer is made from: the
 * guide's stamp, the route, document or data, the query and the one-minute period of the
 * page's extras. Whenever it matches, a 304 is a correct answer; so is the same 200 again,
 * which is what a reverse proxy in front of the app would send. Keeping it here gives a
 * single process without a proxy the same saving: a guide shared on a forum is rendered once
 * per change, not once per visitor. Answers for signed-in people never come here.
 *
 * Only an answer that is plainly public is kept: 200, `public` caching with the ETag it was
 * asked for, no cookie set (http/kept-answers.ts keeps its headers with it).
 */
import { answerStore, type KeptAnswer } from './kept-answers';
import { PUBLIC_CACHING } from './caching-policy';

/** Bounded by bytes: about 90 KB per guide page, so several hundred pages at most. */
const answers = answerStore(48 * 1024 * 1024);

/** The answer kept for this ETag, as a fresh Response, or null. */
export function keptAnswer(etag: string): Response | null {
	return answers.get(etag);
}

/** The bytes and headers kept for this ETag, or null (http/front-door.ts writes them itself). */
export function keptBytes(etag: string): KeptAnswer | null {
	return answers.peek(etag);
}

/**
 * Keeps `response` under `etag` when it is plainly public, and returns the Response to send
 * (the body has been read, so it is a new one with the same bytes and headers).
 */
export async function keepIfPublic(etag: string, response: Response): Promise<Response> {
	if (
		response.headers.get('cache-control') !== PUBLIC_CACHING ||
		response.headers.get('etag') !== etag ||
		response.headers.getSetCookie().length > 0
	)
		return response;
	return answers.keep(etag, response);
}

/** Forget every kept answer (tests; a process that changes what answers are made of). */
export function forgetKeptAnswers(): void {
	answers.clear();
}
