import type { Handle, HandleServerError } from '@sveltejs/kit';
import { closeDb } from '$lib/server/db';
import { logRequest, logUnexpectedError } from '$lib/server/log';

export const handle: Handle = async ({ event, resolve }) => {
	const started = performance.now();
	const response = await resolve(event);
	logRequest(event, response.status, performance.now() - started);
	return response;
};

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status === 404) return { message };
	const errorId = crypto.randomUUID();
	logUnexpectedError(errorId, event, error);
	// Never the stack or SQL: only a generic message and the reference.
	return { message: 'Something went wrong on our side.', errorId };
};

// adapter-node emits this on SIGINT/SIGTERM after in-flight requests finish.
process.once('sveltekit:shutdown' as never, () => {
	void closeDb();
});
