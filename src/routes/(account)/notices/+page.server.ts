import { fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { noticeIdInput, noticePageQuery } from '$lib/schemas/following';
import { requireUser } from '$lib/server/auth/guards';
import * as notices from '$lib/server/services/notices';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const me = requireUser();
	const page = noticePageQuery.parse(url.searchParams.get('page') ?? 1);
	return { notices: await notices.list(me.id, page), labels: notices.NOTICE_KIND_LABELS };
};

export const actions: Actions = {
	/** Opening a notice marks it read and goes to its page. */
	open: async ({ request }) => {
		const me = requireUser();
		const input = noticeIdInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { message: 'Choose a notice.' });
		const link = await notices.markRead(me.id, input.data.id);
		if (!link) return fail(404, { message: 'That notice is gone.' });
		redirect(303, link);
	},
	unread: async ({ request }) => {
		const me = requireUser();
		const input = noticeIdInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { message: 'Choose a notice.' });
		if (!(await notices.markRead(me.id, input.data.id, false)))
			return fail(404, { message: 'That notice is gone.' });
		return { ok: true };
	},
	allRead: async () => {
		const me = requireUser();
		return { marked: await notices.markAllRead(me.id) };
	}
};
