/*
 * Authorization guards for loads, actions and API routes. The hook resolves who is asking
 * (locals.user, re-read from the database on every request); these only decide.
 * Every action or +server.ts that changes data calls one of them itself.
 */
import { error, redirect } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import type { Role } from '$lib/domain/types';
import type { SessionUser } from './session-user';

export type { SessionUser } from './session-user';

/** The signed-in user or null; never throws. */
export function currentUser(): SessionUser | null {
	return getRequestEvent().locals.user;
}

/**
 * The signed-in user. Pages redirect visitors to sign in; API routes answer 401 instead,
 * because a redirect means nothing to a JSON client.
 */
export function requireUser(): SessionUser {
	const { locals, url } = getRequestEvent();
	if (locals.user) return locals.user;
	if (url.pathname.startsWith('/api/')) error(401, 'Sign in first');
	redirect(303, `/signin?redirectTo=${encodeURIComponent(url.pathname + url.search)}`);
}

/** The signed-in user when their role is one of `roles` (admin always passes); else 403. */
export function requireRole(...roles: Role[]): SessionUser {
	const user = requireUser();
	if (user.role === 'admin' || roles.includes(user.role)) return user;
	error(403, 'You do not have access to this page');
}
