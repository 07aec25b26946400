/**
 * What the site header shows about the person signed in (the root layout's `viewer`): their
 * role, which decides the header's links, and their unread notices. Nothing else about them
 * is rendered into a page by the layout. The signed-in guide page is kept by exactly this
 * (http/signed-in-answers.ts), so whatever is added here is part of that key too.
 */
import type { Role } from '$lib/domain/types';
import { unreadCount } from '$lib/server/services/notices';

export interface HeaderViewer {
	role: Role;
	unread: number;
}

/** The header's viewer for `locals`: read once per request, by whichever asks first. */
export async function headerViewer(locals: App.Locals): Promise<HeaderViewer | null> {
	const user = locals.user;
	if (!user) return null;
	locals.headerViewer ??= unreadCount(user.id).then((unread) => ({ role: user.role, unread }));
	return locals.headerViewer;
}
