/*
 * The answer while the database is away (issue 12, item 6): 503 with Retry-After, a calm
 * sentence, and nothing that would end a session. JSON `{ message }` for the API and for
 * SvelteKit's own data and action requests; otherwise SvelteKit's fallback error page
 * (src/error.html), the page it shows when the app itself cannot render.
 */
import { json, type RequestEvent } from '@sveltejs/kit';
import errorTemplate from '../../../error.html?raw';

export const UNAVAILABLE_MESSAGE =
	'Slotwise cannot reach its database just now. Please try again in a minute: you stay signed in, and nothing you saved is lost.';

/** Long enough for a restart to finish, short enough that people come back soon. */
export const RETRY_AFTER_SECONDS = 10;

export const UNAVAILABLE_HEADERS = {
	'retry-after': String(RETRY_AFTER_SECONDS),
	'cache-control': 'no-store'
};

function escapeHtml(text: string): string {
	return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Whether this request wants JSON back rather than a page. */
export function wantsJson(event: RequestEvent): boolean {
	const accept = event.request.headers.get('accept') ?? '';
	return (
		event.url.pathname.startsWith('/api/') ||
		event.isDataRequest ||
		event.request.headers.has('x-sveltekit-action') ||
		(/json/i.test(accept) && !/text\/html/i.test(accept))
	);
}

export function unavailableResponse(event: RequestEvent): Response {
	if (event.request.headers.has('x-sveltekit-action')) {
		// The shape use:enhance reads; it shows the page's error boundary with this message.
		return json(
			{ type: 'error', status: 503, error: { message: UNAVAILABLE_MESSAGE } },
			{ status: 503, headers: UNAVAILABLE_HEADERS }
		);
	}
	if (wantsJson(event)) {
		return json({ message: UNAVAILABLE_MESSAGE }, { status: 503, headers: UNAVAILABLE_HEADERS });
	}
	const page = errorTemplate
		.replaceAll('%sveltekit.status%', '503')
		.replaceAll('%sveltekit.error.message%', escapeHtml(UNAVAILABLE_MESSAGE));
	return new Response(page, {
		status: 503,
		headers: { ...UNAVAILABLE_HEADERS, 'content-type': 'text/html; charset=utf-8' }
	});
}
