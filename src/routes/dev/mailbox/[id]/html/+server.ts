import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { callMailbox, mailboxBase, type MailboxMessage } from '../../mailbox.server';
import type { RequestHandler } from './$types';

const messageId = z.uuid();

/**
 * Dev-only: a caught message's HTML version as its own document. Served under a sandbox
 * CSP (no scripts, no same-origin access, nothing fetched) rather than framed in the
 * app's pages, whose CSP forbids framing.
 */
export const GET: RequestHandler = async ({ params }) => {
	mailboxBase();
	const id = messageId.safeParse(params.id);
	if (!id.success) error(404, 'That message is not in the local mailbox');
	const result = await callMailbox<MailboxMessage>(`/messages/${id.data}`);
	if (!result.ok && result.status === 404)
		error(404, 'That message is no longer in the local mailbox');
	if (!result.ok) error(503, 'The local mail fake did not answer');
	if (!result.data.html) error(404, 'This message has no HTML version');
	return new Response(result.data.html, {
		headers: {
			'content-type': 'text/html; charset=utf-8',
			'content-security-policy':
				"sandbox; default-src 'none'; style-src 'unsafe-inline'; img-src data:; form-action 'none'",
			'cache-control': 'no-store',
			'x-robots-tag': 'noindex'
		}
	});
};
