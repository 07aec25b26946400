/*
 * The server entry `node build` runs: svelte.config.js copies this file to build/index.js,
 * beside adapter-node's own entry (kept as build/server.js) and security-headers.js. Plain
 * JavaScript with no imports from the app: nothing here is compiled.
 *
 * It adds two things in front of adapter-node's server, which still does everything else
 * (environment variables, listening, graceful shutdown):
 * - the baseline security headers on every response before anything else writes one
 *   (security-headers.js; docs/security.md §1): static files, redirects and errors thrown in
 *   hooks carry them too, and a page's own headers (its CSP) replace them;
 * - the app's front door (http/front-door.ts), which answers a visitor's request for an
 *   answer the app keeps without handing it to SvelteKit. The app publishes the door under
 *   a global symbol when it starts; without one every request goes on as before.
 */
import { ServerResponse } from 'node:http';
import { baselineHeaders, originIsHttps } from './security-headers.js';
// @ts-expect-error -- adapter-node's entry, build/server.js, exists only beside the copy in build/.
import { server } from './server.js';

const headers = Object.entries(baselineHeaders({ https: originIsHttps(process.env.ORIGIN) }));
const FRONT_DOOR = Symbol.for('slotwise.front-door');

// polka's listener (attached when adapter-node's entry listened, on import) is taken out and
// called from ours; adapter-node's own request counting for its shutdown stays as it is.
const node = server.server;
const sveltekit = server.attach;
if (!node.listeners('request').includes(sveltekit))
	throw new Error("adapter-node's server has no polka listener where this entry expects it.");
node.removeListener('request', sveltekit);

/**
 * Node's writeHead, except that a 304 loses the baseline Content-Security-Policy. A 304's
 * headers replace those of the answer the browser has stored (RFC 9111 §4.3.4), and the
 * baseline policy, meant for files and JSON, then blocked every script and stylesheet of
 * the page it revalidated (tests/e2e/front-door.e2e.ts). Without one the page keeps its own.
 * @this {import('node:http').ServerResponse}
 * @param {number} status
 * @param {...any} rest
 */
function writeHeadKeepingStoredPolicy(status, ...rest) {
	if (status === 304) this.removeHeader('content-security-policy');
	return ServerResponse.prototype.writeHead.call(this, status, ...rest);
}

/**
 * @param {import('node:http').IncomingMessage} request
 * @param {import('node:http').ServerResponse} response
 */
function answer(request, response) {
	for (const [name, value] of headers) response.setHeader(name, value);
	response.writeHead = writeHeadKeepingStoredPolicy;
	const door = /** @type {any} */ (globalThis)[FRONT_DOOR];
	/** @type {false | Promise<boolean>} */
	let answered = false;
	try {
		answered = typeof door === 'function' ? door(request, response) : false;
	} catch {
		// A request target the door cannot read: SvelteKit answers it as it always has.
	}
	if (answered === false) return sveltekit(request, response);
	answered.then(
		(/** @type {boolean} */ done) => {
			if (!done) sveltekit(request, response);
		},
		() => sveltekit(request, response)
	);
}
node.on('request', answer);

// @ts-expect-error -- as above.
export * from './server.js';
