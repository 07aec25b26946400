// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser } from '$lib/server/auth/session-user';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** Reference shown to the user and written to the log for unexpected errors. */
			errorId?: string;
		}
		interface Locals {
			/** Set by the auth hook on every request: null for visitors and refused sessions. */
			user: SessionUser | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
