/*
 * Auth.js configuration: e-mail + password (Credentials) and e-mail sign-in links
 * (Nodemailer provider with the Sequelize adapter), JWT sessions. Everything Auth.js-specific
 * stays in $lib/server/auth, because @auth/sveltekit is still marked experimental.
 */
import { skipCSRFCheck } from '@auth/core';
import { AccessDenied, CredentialsSignin } from '@auth/core/errors';
import SequelizeAdapter from '@auth/sequelize-adapter';
import { SvelteKitAuth } from '@auth/sveltekit';
import type { SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { z } from 'zod';
import { env } from '$env/dynamic/private';
import { emailAddress } from '$lib/schemas/email';
import { existingPassword } from '$lib/schemas/password';
import { Account, Session, User, VerificationToken, sequelize } from '$lib/server/db';
import { logEvent, logFailure } from '$lib/server/log';
import * as mail from '$lib/server/mail';
import * as templates from '$lib/server/mail/templates';
import * as accounts from '$lib/server/services/accounts';
import { secureCookies } from './cookies';
import { sessionReadFailed } from './session-read';
import './types';

/** Sign-in links work once and expire after 10 minutes (ASVS 6.5.1, 6.5.5). */
export const SIGN_IN_LINK_MINUTES = 10;
/** Sliding idle lifetime: a session unused for this long ends (common practice, no published source). */
export const SESSION_IDLE_SECONDS = 7 * 24 * 3600;
/** Absolute lifetime: sign in again after this, however active (common practice, no published source). */
export const SESSION_ABSOLUTE_SECONDS = 30 * 24 * 3600;

const credentialsInput = z.object({ email: emailAddress, password: existingPassword });

export const authConfig: SvelteKitAuthConfig = {
	adapter: SequelizeAdapter(sequelize, {
		models: { User, Account, Session, VerificationToken } as never,
		synchronize: false
	}),
	basePath: '/auth',
	secret: env.AUTH_SECRET,
	trustHost: true,
	// One decision from the configured origin, never from the request (cookies.ts).
	useSecureCookies: secureCookies(),
	// SvelteKit's own origin check guards every form post (STACK gotcha 6); Auth.js's
	// endpoints for posts are closed in the hook and reached only through our actions.
	skipCSRFCheck,
	session: { strategy: 'jwt', maxAge: SESSION_IDLE_SECONDS },
	logger: {
		/*
		 * Auth.js logs every refused password as an error with its full stack trace. A refusal
		 * is an expected event: one structured line, without the address (issue 12, item 14).
		 * Anything else stays an error, as one JSON line with its stack.
		 */
		error(error) {
			if (error instanceof CredentialsSignin)
				logEvent('sign-in-refused', { method: 'credentials' });
			else if (error instanceof AccessDenied) logEvent('sign-in-refused', { method: 'link' });
			else logFailure('auth-error', error);
		},
		warn(code) {
			logEvent('auth-warning', { code });
		},
		debug() {}
	},
	pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/check-email' },
	providers: [
		Credentials({
			id: 'credentials',
			credentials: { email: {}, password: {} },
			async authorize(raw) {
				const input = credentialsInput.safeParse(raw);
				if (!input.success) return null;
				const user = await accounts.authenticate(input.data.email, input.data.password);
				return user ?? null;
			}
		}),
		Nodemailer({
			id: 'nodemailer',
			server: { host: env.SMTP_HOST ?? '127.0.0.1', port: Number(env.SMTP_PORT ?? 2525) },
			from: env.MAIL_FROM ?? 'Slotwise <no-reply@slotwise.test>',
			maxAge: SIGN_IN_LINK_MINUTES * 60,
			normalizeIdentifier(identifier) {
				const parsed = emailAddress.safeParse(identifier);
				if (!parsed.success) throw new Error('Invalid e-mail address');
				return parsed.data;
			},
			async sendVerificationRequest({ identifier, url }) {
				await mail.send(identifier, templates.signInLink({ url, minutes: SIGN_IN_LINK_MINUTES }));
			}
		})
	],
	callbacks: {
		/**
		 * Sign-in links are for existing, enabled accounts only: for an unknown address no link
		 * is mailed (the answer is the same), and a link can never create an account, let alone
		 * a verified one that skipped sign-up and its limits (issue 12, item 12).
		 */
		async signIn({ user, account }) {
			if (account?.provider !== 'nodemailer') return true;
			return accounts.canSignInByLink(user.email ?? '');
		},
		/**
		 * Runs on sign-in and on every session read. Re-reading the account each time makes a
		 * role change, a disabled account or a password change apply on the next request,
		 * though a JWT itself cannot be revoked. Returning null ends the session.
		 */
		async jwt({ token, user }) {
			const now = Math.floor(Date.now() / 1000);
			if (user) {
				const signedIn = user as unknown as { id: string; sessionVersion?: number };
				token.uid = signedIn.id;
				token.sv = signedIn.sessionVersion ?? 1;
				token.authAt = now;
			}
			if (!token.uid || typeof token.sv !== 'number') return null;
			if (typeof token.authAt !== 'number' || now - token.authAt > SESSION_ABSOLUTE_SECONDS)
				return null;
			let current: Awaited<ReturnType<typeof accounts.sessionUser>>;
			try {
				current = await accounts.sessionUser(token.uid, token.sv);
			} catch (e) {
				// The account could not be read (the database is away): that is not "no session".
				// Keep the token as it is, so the cookie survives, and let the hook answer 503
				// for this request (issue 12, item 6).
				sessionReadFailed(e);
				return token;
			}
			if (!current) return null;
			token.role = current.role;
			token.name = current.name;
			token.email = current.email;
			return token;
		},
		session({ session, token }) {
			return {
				...session,
				user: {
					...session.user,
					id: token.uid ?? '',
					role: token.role ?? 'reader',
					email: token.email ?? '',
					name: token.name ?? null
				}
			};
		}
	}
};

export const { handle: authHandle } = SvelteKitAuth(authConfig);
