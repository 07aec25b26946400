/**
 * Signed-in readers' guide pages, kept in this process and served again to readers who would
 * be shown the very same bytes.
 *
 * What a signed-in guide page holds beyond a visitor's is only the header's viewer (their
 * role and unread notices, http/header-viewer.ts) and the fact of being signed in (fork,
 * report and tip forms): no name, id or address of the reader. The key names the guide's
 * stamp, its extras counter, the route, document or data, the query and that viewer, so two
 * readers share an answer only when both would get it byte for byte. Not kept: a hidden
 * guide (shown to its author and editors with the reason), anything but a plain 200 with
 * private caching. Never a shared cache's: the answer stays `private, no-store`, and the
 * session cookie Auth.js renews for this request is added to it (http/cookie-writes.ts).
 *
 * Why: a signed-in page was rendered per request (about 7 ms of CPU for the demo guide), so
 * fifty signed-in readers of one guide cost fifty renders; now they cost one per change.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { isDatabaseUnavailable } from '$lib/server/db/availability';
import { validatorOf } from '$lib/server/services/guide-view-cache';
import type { GuideStamp } from '$lib/server/services/guide-view-cache';
import { PRIVATE_CACHING } from './caching-policy';
import { withCookieWrites } from './cookie-writes';
import { headerViewer } from './header-viewer';
import { answerStore } from './kept-answers';

const answers = answerStore(32 * 1024 * 1024);

/** The kept answer for this reader and request, or the one `render` makes (kept when it may be). */
export async function signedInAnswer(
	event: RequestEvent,
	stamp: GuideStamp,
	render: () => Promise<Response>
): Promise<Response> {
	if (stamp.hidden || event.request.method !== 'GET') return render();
	let viewer: Awaited<ReturnType<typeof headerViewer>>;
	try {
		viewer = await headerViewer(event.locals);
	} catch (error) {
		// MariaDB went away: the layout meets the same failure inside resolve, where it
		// becomes the calm 503 (hooks.server.ts handleError, outageAs503), not a bare 500.
		if (!isDatabaseUnavailable(error)) throw error;
		return render();
	}
	const key = validatorOf(stamp, [
		'signed-in',
		stamp.extras,
		event.route.id ?? '',
		event.isDataRequest ? 'data' : 'document',
		new URL(event.request.url).search,
		JSON.stringify(viewer)
	]);
	const kept = answers.get(key);
	if (kept) return withCookieWrites(kept, event);
	const response = await render();
	if (response.headers.get('cache-control') !== PRIVATE_CACHING) return response;
	return answers.keep(key, response);
}

/** Forget every kept answer (tests). */
export function forgetSignedInAnswers(): void {
	answers.clear();
}
