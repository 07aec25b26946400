/*
 * Reads the local SMTP fake (scripts/smtp-fake.ts) for the dev-only mailbox pages.
 * MAILBOX_URL is set only when the scripts started the fake; without it these pages answer
 * 404, so they do not exist in a real deployment.
 */
import { error } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import type { StoredMessage } from '../../../../scripts/smtp-fake';

/** The fields these pages show of a message the fake stores (type only: nothing of the script runs). */
export type MailboxMessage = Pick<
	StoredMessage,
	'id' | 'date' | 'to' | 'from' | 'subject' | 'text' | 'html' | 'headers'
>;

export type Fetched<T> = { ok: true; data: T } | { ok: false; status: number | null };

/** The fake's base URL; 404 when this process has no local mailbox. */
export function mailboxBase(): string {
	const base = env.MAILBOX_URL?.trim();
	if (!base) error(404, 'Not Found');
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
