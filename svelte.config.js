import { copyFileSync, existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import nodeAdapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { mdsvex } from 'mdsvex';
import mdsvexConfig from './mdsvex.config.js';

const OUT = 'build';
const base = nodeAdapter({ out: OUT, precompress: false });

/*
 * adapter-node serves static files (and SvelteKit answers redirects and errors thrown in
 * hooks) without passing through our hooks, and it has no option to add headers. So its
 * server entry is kept as build/server.js and build/index.js becomes our small entry
 * (src/lib/server/http/server-entry.js) that sets the baseline security headers on every
 * response before anything else writes one (docs/security.md §1) and opens the app's front
 * door for visitors' kept answers (src/lib/server/http/front-door.ts). `node build` still
 * starts the same server, with the same environment variables and graceful shutdown.
 */
/**
 * @param {import('@sveltejs/kit').Adapter} adapter
 * @returns {import('@sveltejs/kit').Adapter}
 */
function withServerEntry(adapter) {
	return {
		...adapter,
		name: `${adapter.name} + our server entry`,
		async adapt(builder) {
			await adapter.adapt(builder);
			renameSync(join(OUT, 'index.js'), join(OUT, 'server.js'));
			if (existsSync(join(OUT, 'index.js.map'))) {
				renameSync(join(OUT, 'index.js.map'), join(OUT, 'server.js.map'));
				const server = readFileSync(join(OUT, 'server.js'), 'utf8');
				writeFileSync(
					join(OUT, 'server.js'),
					server.replace('sourceMappingURL=index.js.map', 'sourceMappingURL=server.js.map')
				);
			}
			copyFileSync('src/lib/server/http/security-headers.js', join(OUT, 'security-headers.js'));
			copyFileSync('src/lib/server/http/server-entry.js', join(OUT, 'index.js'));
		}
	};
}

/** @type {import('@sveltejs/kit').Config} */
const config = {
	extensions: ['.svelte', ...mdsvexConfig.extensions],
	preprocess: [vitePreprocess(), mdsvex(mdsvexConfig)],
	kit: {
		adapter: withServerEntry(base),
		alias: {
			$tests: 'tests'
		},
		// The origin check moves into our hooks (checkFormOrigin in src/lib/server/auth/hooks.ts),
		// unchanged except for the RFC 8058 one-click unsubscribe POST, which mail providers send
		// without an Origin header and which SvelteKit's own check cannot exempt per route.
		csrf: { trustedOrigins: ['*'] },
		csp: {
			// Hashes, not nonces: a visitor's guide page is served again from memory or a shared
			// cache (src/lib/server/http/visitor-answers.ts), and a nonce must never be reused.
			mode: 'hash',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				// Svelte transitions write inline styles.
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['none'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
