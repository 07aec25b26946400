import { oneClickUnsubscribe } from '$lib/server/newsletter/one-click';
import type { RequestHandler } from './$types';

/*
 * The one-click POST as mail providers send it (RFC 8058 §3.1): no session, no Origin, and
 * no Accept that asks for HTML, so SvelteKit routes it here rather than to the page's form
 * action, whose JSON answer would carry HTTP 200 even for a refused token. Here the status is
 * the outcome: 200 unsubscribed (or already), 400 for a bad body or a malformed, expired or
 * used link, 404 for a forged one. Browsers' form posts still go to the page's action.
 */
export const POST: RequestHandler = async ({ request, url }) => {
	const answer = await oneClickUnsubscribe(await request.formData(), url.searchParams.get('token'));
	return new Response(answer.message, {
		status: answer.status,
		headers: { 'content-type': 'text/plain; charset=utf-8', 'cache-control': 'no-store' }
	});
};
