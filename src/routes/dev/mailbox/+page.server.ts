import { fail } from '@sveltejs/kit';
import { callMailbox, mailboxBase, summary, type MailboxMessage } from './mailbox.server';
import type { Actions, PageServerLoad } from './$types';

/** Dev-only: the newest messages the local SMTP fake caught (absent without MAILBOX_URL). */
export const load: PageServerLoad = async () => {
	const base = mailboxBase();
	const result = await callMailbox<MailboxMessage[]>('/messages');
	return {
		mailboxUrl: base,
		reachable: result.ok,
		// The fake keeps up to 500; the newest 50 are plenty to find a link.
		messages: result.ok ? result.data.slice(0, 50).map(summary) : [],
		total: result.ok ? result.data.length : 0
	};
};

export const actions: Actions = {
	clear: async () => {
		mailboxBase();
		const result = await callMailbox<null>('/messages', { method: 'DELETE' });
		if (!result.ok)
			return fail(503, { message: 'The local mail fake did not answer.', problem: true });
		return { message: 'Mailbox emptied.', problem: false };
	}
};
