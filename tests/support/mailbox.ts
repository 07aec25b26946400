/*
 * Reads the local SMTP fake's mailbox (scripts/smtp-fake.ts) over its HTTP JSON API.
 * Plain fetch, no test-runner imports: vitest and Playwright tests both use it.
 * `npm test` starts the fake and sets MAILBOX_URL; to run a test by hand:
 *   bash scripts/smtp-fake.sh start
 */

/** A message as the fake stores and serves it (one definition, in the fake itself). */
import type { StoredMessage } from '../../scripts/smtp-fake';

export type MailboxMessage = StoredMessage;

export function mailboxUrl(): string {
	const url = process.env.MAILBOX_URL;
	if (!url) {
		throw new Error(
			'MAILBOX_URL is not set. `npm test` starts the local SMTP fake and sets it; by hand run ' +
				'`bash scripts/smtp-fake.sh start` and set MAILBOX_URL=http://127.0.0.1:2580.'
		);
	}
	return url.replace(/\/+$/, '');
}

async function call(path: string, init?: RequestInit): Promise<Response> {
	const url = `${mailboxUrl()}${path}`;
	let response: Response;
	try {
		response = await fetch(url, { ...init, signal: AbortSignal.timeout(5_000) });
	} catch (e) {
		throw new Error(
			`The SMTP fake's mailbox at ${url} does not answer (start it: bash scripts/smtp-fake.sh start). ${String(e)}`,
			{ cause: e }
		);
	}
	if (!response.ok)
		throw new Error(`Mailbox ${init?.method ?? 'GET'} ${path} answered ${response.status}`);
	return response;
}

/** Forgets every message the fake holds. */
export async function clearMailbox(): Promise<void> {
	await call('/messages', { method: 'DELETE' });
}

/** Every message the fake holds, newest first. */
export async function listMessages(): Promise<MailboxMessage[]> {
	return (await (await call('/messages')).json()) as MailboxMessage[];
}

function isFor(message: MailboxMessage, to: string): boolean {
	const wanted = to.toLowerCase();
	return message.to.some((address) => address.toLowerCase() === wanted);
}

/**
 * Polls until a message delivered to `to` (SMTP envelope, case-insensitive) arrives,
 * optionally with a matching subject, and returns the newest such message. `after`: only a
 * message the fake accepted at or after that moment, so one left by an earlier test (or an
 * earlier run against the same fake) is not taken for the one a test is waiting for.
 */
export async function waitForMessage({
	to,
	subject,
	after,
	timeoutMs = 5_000
}: {
	to: string;
	subject?: RegExp;
	after?: Date;
	timeoutMs?: number;
}): Promise<MailboxMessage> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const found = (await listMessages()).find(
			(m) =>
				isFor(m, to) &&
				(subject === undefined || subject.test(m.subject)) &&
				(after === undefined || Date.parse(m.receivedAt) >= after.getTime() - 1_000)
		);
		if (found) return found;
		if (Date.now() >= deadline) {
			throw new Error(
				`No e-mail to ${to}${subject ? ` with a subject matching ${subject}` : ''} arrived within ${timeoutMs} ms`
			);
		}
		await new Promise((resolve) => setTimeout(resolve, 100));
	}
}

/** Every http(s) URL in the plain-text body, in order. */
export function linksIn(message: Pick<MailboxMessage, 'text'>): string[] {
	// A sentence-ending full stop or comma after a link is not part of it.
	return (message.text.match(/https?:\/\/[^\s<>"')\]]+/g) ?? []).map((link) =>
		link.replace(/[.,;:!?]+$/, '')
	);
}

/**
 * The first URL in the plain-text body whose path starts with `pathPrefix`
 * (e.g. '/signin/verify'); throws, listing the links found, when there is none.
 */
export function firstLink(
	message: Pick<MailboxMessage, 'text' | 'subject'>,
	pathPrefix: string
): string {
	const links = linksIn(message);
	const match = links.find((link) => {
		try {
			return new URL(link).pathname.startsWith(pathPrefix);
		} catch {
			return false;
		}
	});
	if (match === undefined) {
		throw new Error(
			`No link starting with ${pathPrefix} in "${message.subject}"; links found: ${links.join(', ') || 'none'}`
		);
	}
	return match;
}
