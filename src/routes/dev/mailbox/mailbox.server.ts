/*
 * Reads the local SMTP fake (scripts/smtp-fake.ts) for the dev-only mailbox pages.
 *
 * These pages show every account's sign-in and reset links, so whoever reaches them can take
 * over any account (issue 12, item 10). They exist only in development or the local demo
 * (MAILBOX_URL is set when the scripts started the fake) AND when the app is reachable on a
 * loopback address only: it listens on one (adapter-node's HOST; `npm run dev` binds
 * 127.0.0.1) and its public origin, when configured, is one too. Everywhere else every page
 * and action here answers 404, exactly like a route that does not exist.
 */
import { error } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { env } from '$env/dynamic/private';
import type { StoredMessage } from '../../../../scripts/smtp-fake';

/** The fields these pages show of a message the fake stores (type only: nothing of the script runs). */
export type MailboxMessage = Pick<
	StoredMessage,
	'id' | 'date' | 'to' | 'from' | 'subject' | 'text' | 'html' | 'headers'
>;

export type Fetched<T> = { ok: true; data: T } | { ok: false; status: number | null };

/** 127.0.0.0/8, ::1 and "localhost": names for this machine only. */
export function isLoopback(host: string): boolean {
	const bare = host
		.trim()
		.toLowerCase()
		.replace(/^\[|\]$/g, '');
	return bare === 'localhost' || bare === '::1' || /^127(?:\.\d{1,3}){3}$/.test(bare);
}

function hostOf(url: string | undefined): string | null {
	try {
		return url ? new URL(url).hostname : null;
	} catch {
		return null;
	}
}

/** The address the app listens on, when this process can tell it is loopback-only. */
export function loopbackListenAddress(): string | null {
	// adapter-node listens on HOST, 0.0.0.0 (every interface) when it is unset.
	const listen = dev ? '127.0.0.1' : (env.HOST?.trim() ?? '0.0.0.0');
	if (!isLoopback(listen)) return null;
	const origin = hostOf(env.ORIGIN?.trim());
	if (env.ORIGIN?.trim() && (origin === null || !isLoopback(origin))) return null;
	return listen;
}

/** The fake's base URL; 404 unless this is a local, loopback-only development or demo server. */
export function mailboxBase(): string {
	const base = env.MAILBOX_URL?.trim();
	const fake = hostOf(base);
	if (!base || fake === null || !isLoopback(fake) || loopbackListenAddress() === null)
		error(404, 'Not Found');
	return base.replace(/\/+$/, '');
}

/** One call to the fake; a fake that is down gives `ok: false` rather than a 500. */
export async function callMailbox<T>(path: string, init?: RequestInit): Promise<Fetched<T>> {
	try {
		const response = await fetch(`${mailboxBase()}${path}`, {
			...init,
			signal: AbortSignal.timeout(3_000)
		});
		if (!response.ok) return { ok: false, status: response.status };
		return { ok: true, data: (response.status === 204 ? null : await response.json()) as T };
	} catch {
		return { ok: false, status: null };
	}
}

/** Only the fields the pages show. */
export function summary(m: MailboxMessage) {
	return { id: m.id, date: m.date, to: m.to, from: m.from, subject: m.subject, text: m.text };
}
