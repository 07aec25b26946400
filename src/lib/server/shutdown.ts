/*
 * Once the process has been told to stop (SIGTERM or SIGINT), every answer carries
 * `Connection: close`.
 *
 * adapter-node then stops accepting connections and closes the idle ones, but a kept-alive
 * connection whose request is still running becomes idle only after its answer. It then
 * holds the server open until Node's keep-alive timeout (5 s) and accepts new requests
 * meanwhile, so a proxy that keeps reusing its upstream connections (docs/deployment.md)
 * can keep a stopping process busy until SHUTDOWN_TIMEOUT cuts whatever is in flight. With
 * the header, each connection closes right after its answer, the proxy opens its next one
 * to another process, and this one exits as soon as its last request is done
 * (tests/e2e/fault-shutdown.e2e.ts).
 */
import type { Handle } from '@sveltejs/kit';

let stopping = false;

/** Production only: in `vite dev` a SIGTERM listener would keep the dev server from ending. */
export function watchForShutdown(): void {
	for (const signal of ['SIGTERM', 'SIGINT'] as const)
		process.once(signal, () => {
			stopping = true;
		});
}

export const closeConnectionsWhenStopping: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (stopping) {
		try {
			response.headers.set('connection', 'close');
		} catch {
			// A response with immutable headers (Response.redirect) keeps Node's default.
		}
	}
	return response;
};
