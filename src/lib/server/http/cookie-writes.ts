/**
 * Remembers the cookies the hooks set on a request (Auth.js renews the session cookie on
 * every signed-in request), so that an answer made without `resolve` can carry them too.
 * SvelteKit adds `event.cookies` writes to the response inside `resolve` only; an answer a
 * hook returns from memory (http/signed-in-answers.ts) would otherwise drop the renewal and
 * let an active reader's session lapse. Runs before the session check.
 */
import type { Handle } from '@sveltejs/kit';

export const recordCookieWrites: Handle = ({ event, resolve }) => {
	const writes: NonNullable<App.Locals['cookieWrites']> = [];
	const set = event.cookies.set.bind(event.cookies);
	event.cookies.set = (name, value, options) => {
		writes.push([name, value, options]);
		set(name, value, options);
	};
	event.locals.cookieWrites = writes;
	return resolve(event);
};

/** Adds the request's recorded cookie writes to `response` (a fresh one, headers mutable). */
export function withCookieWrites(
	response: Response,
	event: Parameters<Handle>[0]['event']
): Response {
	for (const [name, value, options] of event.locals.cookieWrites ?? []) {
		response.headers.append('set-cookie', event.cookies.serialize(name, value, options));
	}
	return response;
}
