import { beforeEach, describe, expect, it } from 'vitest';
import { PUBLIC_CACHING } from '$lib/server/http/caching-policy';
import { forgetKeptAnswers, keepIfPublic, keptAnswer } from '$lib/server/http/visitor-answers';

/*
 * Only a plainly public answer may be served again to another visitor: anything private, with
 * a cookie, another status or another validator must go out once and be forgotten.
 */
const ETAG = 'W/"abc"';

function answer(init: { status?: number; headers?: Record<string, string>; body?: string }) {
	return new Response(init.body ?? '<p>guide</p>', {
		status: init.status ?? 200,
		headers: {
			'content-type': 'text/html',
			'cache-control': PUBLIC_CACHING,
			etag: ETAG,
			...init.headers
		}
	});
}

beforeEach(() => forgetKeptAnswers());

describe('answers kept for visitors', () => {
	it('keeps a public 200 with its ETag and serves the same bytes and headers again', async () => {
		const sent = await keepIfPublic(ETAG, answer({ headers: { 'content-security-policy': 'x' } }));
		expect(await sent.text()).toBe('<p>guide</p>');
		const again = keptAnswer(ETAG);
		expect(again?.status).toBe(200);
		expect(await again?.text()).toBe('<p>guide</p>');
		expect(again?.headers.get('content-security-policy')).toBe('x');
		expect(again?.headers.get('etag')).toBe(ETAG);
		// A second serving is not spent by the first.
		expect(await keptAnswer(ETAG)?.text()).toBe('<p>guide</p>');
	});

	it.each([
		['a cookie is set', { headers: { 'set-cookie': 'a=b' } }],
		['the answer is private', { headers: { 'cache-control': 'private, no-store' } }],
		['it carries another ETag', { headers: { etag: 'W/"other"' } }],
		['it is not a 200', { status: 404 }]
	])('keeps nothing when %s, and still sends the answer', async (_why, init) => {
		const sent = await keepIfPublic(ETAG, answer(init));
		expect(await sent.text()).toBe('<p>guide</p>');
		expect(keptAnswer(ETAG)).toBeNull();
	});

	it('knows nothing of an ETag it never kept', () => {
		expect(keptAnswer('W/"never"')).toBeNull();
	});
});
