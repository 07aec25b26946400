/*
 * Cookie flags, decided once from the configured public origin (adapter-node's ORIGIN) and
 * applied to every cookie Auth.js asks us to set, at sign-in, on every session refresh and
 * at sign-out alike (docs/security.md §1, ASVS 3.3.1). Left to themselves they differed:
 * Auth.js derived `Secure` from the request URL or an X-Forwarded-Proto header, and
 * SvelteKit's cookies.set() adds `Secure` by default whenever the host is not "localhost".
 */
import type { Cookies } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { env } from '$env/dynamic/private';
import { originIsHttps } from '$lib/server/http/security-headers.js';

/**
 * True when the site is served over https. Without ORIGIN, adapter-node assumes https (and
 * so do we), except in the Vite dev server, which serves plain http.
 */
export function secureCookies(): boolean {
	const origin = env.ORIGIN?.trim();
	if (origin) return originIsHttps(origin);
	return !dev;
}

export interface AuthCookie {
	name: string;
	value: string;
	options?: { maxAge?: number; expires?: Date };
}

/** Sets cookies Auth.js returned, with our flags rather than whatever it or SvelteKit would pick. */
export function setAuthCookies(cookies: Cookies, list: readonly AuthCookie[] | undefined): void {
	for (const cookie of list ?? []) {
		// Only the lifetime comes from Auth.js; every other flag is ours.
		const { maxAge, expires } = cookie.options ?? {};
		cookies.set(cookie.name, cookie.value, {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			secure: secureCookies(),
			...(typeof maxAge === 'number' ? { maxAge } : {}),
			...(expires instanceof Date ? { expires } : {})
		});
	}
}
