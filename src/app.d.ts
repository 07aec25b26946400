// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser } from '$lib/server/auth/session-user';
import type { GuideStamp } from '$lib/server/services/guide-view-cache';
import type { HeaderViewer } from '$lib/server/http/header-viewer';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** Reference shown to the user and written to the log for unexpected errors. */
			errorId?: string;
			/** Set when the database could not be reached: the page says so calmly (503). */
			unavailable?: boolean;
		}
		interface Locals {
			/** Set by the auth hook on every request: null for visitors and refused sessions. */
			user: SessionUser | null;
			/** The session could not be checked because the database is away (the hook answers 503). */
			sessionUnavailable?: boolean;
			/** Something in this request failed to reach the database (handleError); answered as 503. */
			databaseUnavailable?: boolean;
			/** The guide page and pricing API: the guide's stamp, read once by the caching hook. */
			guideStamp?: GuideStamp | null;
			/** The ETag of a visitor's guide page or pricing answer (http/guide-caching.ts). */
			guideEtag?: string;
			/** The header's viewer (http/header-viewer.ts), read once per request. */
			headerViewer?: Promise<HeaderViewer>;
			/** Cookies the hooks set on this request, for an answer made without resolve (http/cookie-writes.ts). */
			cookieWrites?: [string, string, Parameters<import('@sveltejs/kit').Cookies['set']>[2]][];
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
