/*
 * Our form actions call Auth.js in-process (its own POST endpoints are closed in the hook),
 * so zod validation and rate limits always run first and errors come back as field
 * messages instead of Auth.js's redirects.
 */
import { Auth, raw } from '@auth/core';
import type { Session } from '@auth/core/types';
import { AccessDenied, CredentialsSignin } from '@auth/core/errors';
import type { RequestEvent } from '@sveltejs/kit';
import { runLater } from '$lib/server/background';
import { authConfig } from './config';
import { setAuthCookies } from './cookies';

/** One Auth.js call in-process, as a POST of `fields` to /auth/`path` on `origin`. */
function authRequest(
	origin: string,
	path: string,
	fields: Record<string, string>,
	cookie?: string
) {
	const headers = new Headers({ 'content-type': 'application/x-www-form-urlencoded' });
	if (cookie) headers.set('cookie', cookie);
	const request = new Request(`${origin}/auth/${path}`, {
		method: 'POST',
		headers,
		body: new URLSearchParams(fields)
	});
	return Auth(request, { ...authConfig, raw });
}

async function callAuth(
	event: RequestEvent,
	path: string,
	fields: Record<string, string>
): Promise<string> {
	const response = await authRequest(
		event.url.origin,
		path,
		fields,
		event.request.headers.get('cookie') ?? undefined
	);
	setAuthCookies(event.cookies, response.cookies);
	return response.redirect ?? '';
}

function failed(redirectUrl: string): boolean {
	return new URL(redirectUrl, 'http://x').searchParams.has('error');
}

/** Signs in with e-mail and password; false when Auth.js refused the credentials. */
export async function signInWithPassword(
	event: RequestEvent,
	email: string,
	password: string
): Promise<boolean> {
	try {
		const target = await callAuth(event, 'callback/credentials', {
			email,
			password,
			callbackUrl: '/'
		});
		return !failed(target);
	} catch (e) {
		// In raw mode Auth.js throws refused credentials instead of redirecting.
		if (e instanceof CredentialsSignin) return false;
		throw e;
	}
}

/**
 * Mails a single-use sign-in link, after the answer has gone out. Auth.js sends it only to
 * an existing account (the signIn callback in config.ts), so whether the address has an
 * account shows neither in the answer nor in its timing (issue 12, items 8 and 12). A
 * refusal is logged by Auth.js's logger as a "sign-in-refused" line; nothing else happens.
 */
export function sendSignInLinkLater(origin: string, email: string, redirectTo: string): void {
	runLater('sign-in-link', async () => {
		try {
			await authRequest(origin, 'signin/nodemailer', { email, callbackUrl: redirectTo });
		} catch (e) {
			if (e instanceof AccessDenied) return;
			throw e;
		}
	});
}

export async function signOut(event: RequestEvent): Promise<void> {
	await callAuth(event, 'signout', { callbackUrl: '/' });
}

/** Auth.js's session cookie, plain or `__Secure-`, whole or in chunks (`.0`, `.1`, …). */
const SESSION_COOKIE = /(?:^|;\s*)(?:__Secure-)?authjs\.session-token(?:\.\d+)?=/;

/**
 * The session of this request, read in-process like the actions above (rather than through
 * @auth/sveltekit's `locals.auth()`, which builds its URL from Host and X-Forwarded-Proto
 * headers and leaves the refreshed cookie's flags to SvelteKit's defaults), so the refreshed
 * cookie gets the same flags as at sign-in. Null for visitors and ended sessions.
 */
export async function readSession(event: RequestEvent): Promise<Session | null> {
	// No session cookie, no session: a visitor's request skips Auth.js altogether (it was a
	// large share of a visitor's page, and its only other output, the callback-url cookie, is
	// set by the sign-in pages that use it).
	if (!SESSION_COOKIE.test(event.request.headers.get('cookie') ?? '')) return null;
	const request = new Request(`${event.url.origin}/auth/session`, {
		headers: { cookie: event.request.headers.get('cookie') ?? '' }
	});
	const response = await Auth(request, { ...authConfig, raw });
	setAuthCookies(event.cookies, response.cookies);
	const session = response.body as Session | null | undefined;
	return session && typeof session === 'object' && 'user' in session ? session : null;
}
