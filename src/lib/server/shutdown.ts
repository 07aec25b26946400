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

/*
 * Requests this process is still handling. adapter-node emits `sveltekit:shutdown` once its
 * server has closed, and Node counts a connection whose client went away as closed even
 * while the request on it still runs here (a password check, a fork's transaction). Closing
 * the pools then failed those requests half-way ("connection manager was closed") and could
 * leave the shutdown waiting on a connection that was never given back, so the process
 * never exited (tests/e2e/fault-shutdown.e2e.ts). The shutdown waits for them first.
 */
let inFlight = 0;

/**
 * Resolves once no request has been handled for a moment (two looks 50 ms apart: a request
 * whose connection was accepted before the close may reach the hooks a little later), or
 * after `maxMs` when a request is stuck for good.
 */
export async function requestsFinished(maxMs = 30_000): Promise<void> {
	const until = Date.now() + maxMs;
	let idleLooks = 0;
	while (idleLooks < 2 && Date.now() < until) {
		idleLooks = inFlight === 0 ? idleLooks + 1 : 0;
		await new Promise((done) => setTimeout(done, 50));
	}
}

/** Production only: in `vite dev` a SIGTERM listener would keep the dev server from ending. */
export function watchForShutdown(): void {
	for (const signal of ['SIGTERM', 'SIGINT'] as const)
		process.once(signal, () => {
			stopping = true;
		});
}

/** Whether the process has been told to stop. */
export function isStopping(): boolean {
	return stopping;
}

/** Runs `work` as a request the shutdown waits for (the hooks, and http/front-door.ts). */
export async function asCountedRequest<T>(work: () => T | Promise<T>): Promise<T> {
	inFlight++;
	try {
		return await work();
	} finally {
		inFlight--;
	}
}

export const closeConnectionsWhenStopping: Handle = async ({ event, resolve }) => {
	const response = await asCountedRequest(() => resolve(event));
	if (stopping) {
		try {
			response.headers.set('connection', 'close');
		} catch {
			// A response with immutable headers (Response.redirect) keeps Node's default.
		}
	}
	return response;
};
