// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Error {
			message: string;
			/** Reference shown to the user and written to the log for unexpected errors. */
			errorId?: string;
		}
		// interface Locals {} — the session arrives with sign-in.
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
