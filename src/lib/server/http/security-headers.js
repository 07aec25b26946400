/*
 * The security headers every answer carries (docs/security.md §1, ASVS 3.4.x), in one place
 * for the two layers that apply them: the `securityHeaders` hook (pages, endpoints, actions)
 * and the server entry that svelte.config.js wraps around adapter-node's, which sets them
 * before anything else answers, so static files, redirects and errors thrown in hooks, and
 * SvelteKit's fallback error page carry them too.
 *
 * Plain JavaScript with no imports: svelte.config.js copies this file next to the built
 * server (build/security-headers.js), where nothing is compiled.
 */

/**
 * The CSP for answers that are not pages SvelteKit renders (files, JSON, redirects, the
 * fallback error page): nothing runs, nothing frames them. Rendered pages replace it with
 * their own policy from svelte.config.js (hashes of their inline scripts).
 */
export const BASELINE_CSP = [
	"default-src 'none'",
	"style-src 'unsafe-inline'",
	"img-src 'self' data:",
	"object-src 'none'",
	"base-uri 'none'",
	"form-action 'self'",
	"frame-ancestors 'none'"
].join('; ');

/**
 * Whether the public origin (adapter-node's ORIGIN) is https. Cookie flags and HSTS follow
 * this one configured value, never a request header a client or proxy could change.
 * @param {string | undefined} origin
 * @returns {boolean}
 */
export function originIsHttps(origin) {
	if (!origin) return false;
	try {
		return new URL(origin).protocol === 'https:';
	} catch {
		return false;
	}
}

/**
 * @param {{ https: boolean }} options
 * @returns {Record<string, string>}
 */
export function baselineHeaders({ https }) {
	/** @type {Record<string, string>} */
	const headers = {
		'x-content-type-options': 'nosniff',
		'x-frame-options': 'DENY',
		'referrer-policy': 'strict-origin-when-cross-origin',
		'permissions-policy': 'camera=(), microphone=(), geolocation=(), interest-cohort=()',
		'cross-origin-opener-policy': 'same-origin',
		'content-security-policy': BASELINE_CSP
	};
	if (https) headers['strict-transport-security'] = 'max-age=31536000; includeSubDomains';
	return headers;
}
