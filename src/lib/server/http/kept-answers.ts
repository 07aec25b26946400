/**
 * Whole answers kept in this process by a key that names everything they were made from
 * (http/visitor-answers.ts for visitors, http/signed-in-answers.ts for signed-in readers),
 * in an LRU bounded by bytes. Headers are kept with the body (the Content-Security-Policy
 * holds the hashes of the page's inline scripts, svelte.config.js `csp.mode: 'hash'`), except
 * those that belong to one exchange: a cookie set for one request is never sent again.
 */
import { LRUCache } from 'lru-cache';

export interface KeptAnswer {
	body: Uint8Array<ArrayBuffer>;
	headers: [string, string][];
}

/** Headers that belong to one exchange, not to the answer. */
const NOT_KEPT = new Set(['set-cookie', 'date', 'content-length', 'connection']);

export interface AnswerStore {
	/** The answer kept under `key`, as a fresh Response, or null. */
	get(key: string): Response | null;
	/** The kept bytes and headers themselves, for an answer written straight to Node's response. */
	peek(key: string): KeptAnswer | null;
	/** Keeps a 200's bytes and headers under `key`; returns the Response to send in its place. */
	keep(key: string, response: Response): Promise<Response>;
	clear(): void;
}

export function answerStore(maxBytes: number): AnswerStore {
	const answers = new LRUCache<string, KeptAnswer>({
		maxSize: maxBytes,
		sizeCalculation: (answer) => Math.max(1, answer.body.byteLength)
	});
	return {
		get(key) {
			const kept = answers.get(key);
			return kept ? new Response(kept.body, { status: 200, headers: kept.headers }) : null;
		},
		peek(key) {
			return answers.get(key) ?? null;
		},
		async keep(key, response) {
			if (response.status !== 200 || !response.body) return response;
			const body = new Uint8Array(await response.arrayBuffer());
			const headers = [...response.headers].filter(([name]) => !NOT_KEPT.has(name.toLowerCase()));
			answers.set(key, { body, headers });
			return new Response(body, { status: 200, headers: [...response.headers] });
		},
		clear() {
			answers.clear();
		}
	};
}
