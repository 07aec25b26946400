import { fail } from '@sveltejs/kit';
import {
	callMailbox,
	loopbackListenAddress,
	mailboxBase,
	summary,
	type MailboxMessage
} from './mailbox.server';
import type { Actions, PageServerLoad } from './$types';

/** Dev-only: the newest messages the local SMTP fake caught (404 unless local; mailbox.server.ts). */
export const load: PageServerLoad = async () => {
	const base = mailboxBase();
	const result = await callMailbox<MailboxMessage[]>('/messages');
	return {
		mailboxUrl: base,
		listenAddress: loopbackListenAddress(),
		reachable: result.ok,
		// The fake keeps up to 500; the newest 50 are plenty to find a link.
		messages: result.ok ? result.data.slice(0, 50).map(summary) : [],
		total: result.ok ? result.data.length : 0
	};
};

export const actions: Actions = {
	// The same condition as the page: 404 anywhere but a local, loopback-only server.
	clear: async () => {
		mailboxBase();
		const result = await callMailbox<null>('/messages', { method: 'DELETE' });
		if (!result.ok)
			return fail(503, { message: 'The local mail fake did not answer.', problem: true });
		return { message: 'Mailbox emptied.', problem: false };
	}
};
