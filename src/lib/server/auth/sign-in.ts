/*
 * Our form actions call Auth.js in-process (its own POST endpoints are closed in the hook),
 * so zod validation and rate limits always run first and errors come back as field
 * messages instead of Auth.js's redirects.
 */
import { Auth, raw } from '@auth/core';
import { CredentialsSignin } from '@auth/core/errors';
import type { RequestEvent } from '@sveltejs/kit';
import { authConfig } from './config';

async function callAuth(
	event: RequestEvent,
	path: string,
	fields: Record<string, string>
): Promise<string> {
	const headers = new Headers({ 'content-type': 'application/x-www-form-urlencoded' });
	const cookie = event.request.headers.get('cookie');
	if (cookie) headers.set('cookie', cookie);
	const request = new Request(`${event.url.origin}/auth/${path}`, {
		method: 'POST',
		headers,
		body: new URLSearchParams(fields)
	});
	const response = await Auth(request, { ...authConfig, raw });
	for (const c of response.cookies ?? []) {
		event.cookies.set(c.name, c.value, { path: '/', ...c.options });
	}
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

/** Mails a single-use sign-in link; false when Auth.js could not send it. */
export async function sendSignInLink(
	event: RequestEvent,
	email: string,
	redirectTo: string
): Promise<boolean> {
	const target = await callAuth(event, 'signin/nodemailer', { email, callbackUrl: redirectTo });
	return !failed(target);
}

export async function signOut(event: RequestEvent): Promise<void> {
	await callAuth(event, 'signout', { callbackUrl: '/' });
}
