import { describe, expect, it } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { signedInAnswer } from '$lib/server/http/signed-in-answers';
import type { GuideStamp } from '$lib/server/services/guide-view-cache';

/*
 * The kept signed-in page needs the header's viewer (the unread count, from MariaDB) before
 * it can look an answer up. When that read meets an outage, the page must be rendered as
 * usual, where the same failure becomes the calm 503, rather than fail in the hook (a 500).
 */
const stamp: GuideStamp = {
	guideId: 1,
	revisionId: 2,
	authorId: null,
	hidden: false,
	version: '["test"]',
	extras: '0'
};

function eventWith(headerViewer: Promise<never>): RequestEvent {
	return {
		request: new Request('http://example.test/guides/a-guide'),
		route: { id: '/(public)/guides/[slug=slug]' },
		isDataRequest: false,
		locals: {
			user: { id: 'u1', email: 'reader@example.test', name: null, role: 'reader' },
			headerViewer
		}
	} as unknown as RequestEvent;
}

describe('a signed-in page kept in memory', () => {
	it('is rendered as usual when the unread count cannot be read for an outage', async () => {
		const outage = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:3307'), {
			code: 'ECONNREFUSED'
		});
		const failed = Promise.reject(outage);
		failed.catch(() => undefined);
		const answer = await signedInAnswer(eventWith(failed), stamp, async () => new Response('page'));
		expect(await answer.text()).toBe('page');
	});

	it('lets any other failure through', async () => {
		const failed = Promise.reject(new TypeError('a bug'));
		failed.catch(() => undefined);
		await expect(
			signedInAnswer(eventWith(failed), stamp, async () => new Response('page'))
		).rejects.toThrow('a bug');
	});
});
