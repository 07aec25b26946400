import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { callMailbox, mailboxBase, type MailboxMessage } from '../mailbox.server';
import type { PageServerLoad } from './$types';

// The fake's ids are UUIDs; anything else never reaches its URL.
const messageId = z.uuid();

/** Dev-only: one caught message with its headers; the HTML version is served by ./html. */
export const load: PageServerLoad = async ({ params }) => {
	mailboxBase();
	const id = messageId.safeParse(params.id);
	if (!id.success) error(404, 'That message is not in the local mailbox');
	const result = await callMailbox<MailboxMessage>(`/messages/${id.data}`);
	if (!result.ok && result.status === 404)
		error(404, 'That message is no longer in the local mailbox');
	if (!result.ok)
		error(
			503,
			'The local mail fake did not answer. Start it with: bash scripts/smtp-fake.sh start'
		);
	const m = result.data;
	return {
		message: {
			id: m.id,
			date: m.date,
			to: m.to,
			from: m.from,
			subject: m.subject,
			text: m.text,
			html: m.html !== '',
			headers: m.headers
		}
	};
};
