/*
 * Read-your-own-writes with a read replica, decided in this one place.
 *
 * With a replica configured (DB_REPLICA_PORT), plain SELECTs read from it, and it may trail
 * the primary by a moment. So a request that may write (any method but GET, HEAD and
 * OPTIONS, and Auth.js's callbacks: a sign-in link's callback writes on a GET) runs all
 * its reads on the primary, and marks its client for a few seconds with a cookie holding
 * the time until which that client's reads stay on the primary: the page shown after a
 * form's redirect, the `use:enhance` reload and the next API call see the change just made.
 *
 * The cookie is not signed: all it can do is send its holder's own reads to the primary,
 * which a client can get anyway by writing something. It carries no identity and no data.
 * Without a replica this hook does nothing and sets no cookie.
 */
import type { Handle } from '@sveltejs/kit';
import { readFromPrimary, replicaConfigFromEnv } from './connection';

export const RECENT_WRITE_COOKIE = 'slotwise-recent-write';

const READ_ONLY_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** How long after a write its client keeps reading from the primary (READ_PRIMARY_AFTER_WRITE_SECONDS, default 5). */
function windowSeconds(): number {
	const value = Number(process.env.READ_PRIMARY_AFTER_WRITE_SECONDS ?? 5);
	return Number.isFinite(value) && value >= 0 ? value : 5;
}

let replicaConfigured: boolean | undefined;

export const readYourWrites: Handle = ({ event, resolve }) => {
	replicaConfigured ??= replicaConfigFromEnv() !== null;
	if (!replicaConfigured) return resolve(event);

	const writes =
		!READ_ONLY_METHODS.has(event.request.method) ||
		event.url.pathname.startsWith('/auth/callback/');
	if (writes) {
		const seconds = windowSeconds();
		event.cookies.set(RECENT_WRITE_COOKIE, String(Date.now() + seconds * 1000), {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			secure: event.url.protocol === 'https:',
			maxAge: Math.max(1, Math.ceil(seconds))
		});
		return readFromPrimary(() => resolve(event));
	}
	const until = Number(event.cookies.get(RECENT_WRITE_COOKIE) ?? 0);
	return until > Date.now() ? readFromPrimary(() => resolve(event)) : resolve(event);
};
