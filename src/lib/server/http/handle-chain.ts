/**
 * Composes the server hooks in order, as SvelteKit's `sequence` does, without the tracing
 * span it opens around each one.
 *
 * `sequence` records an OpenTelemetry span per hook and hands each one a fresh copy of the
 * event carrying it. We enable no tracing (svelte.config.js), and with fifteen hooks that
 * bookkeeping was about a third of the app's time for an answer kept in memory (a visitor's
 * guide list: CPU profile under 50 connections, docs/benchmarks.md). The event is the same
 * object all the way down here, so `getRequestEvent()` sees what the hooks set on it.
 *
 * Resolve options are merged as `sequence` merges them: every hook's `transformPageChunk`
 * runs, the innermost first; for the other two the outermost hook that sets one wins.
 */
import type { Handle, ResolveOptions } from '@sveltejs/kit';

type Resolve = Parameters<Handle>[0]['resolve'];

export function chain(...handles: Handle[]): Handle {
	return ({ event, resolve }) => step(0, event, resolve, undefined);

	function step(
		i: number,
		event: Parameters<Handle>[0]['event'],
		resolve: Resolve,
		outer: ResolveOptions | undefined
	): ReturnType<Handle> {
		const handle = handles[i];
		if (!handle) return resolve(event, outer);
		return handle({
			event,
			resolve: (next, options) => step(i + 1, next, resolve, merged(outer, options))
		});
	}
}

function merged(
	outer: ResolveOptions | undefined,
	inner: ResolveOptions | undefined
): ResolveOptions | undefined {
	if (!outer) return inner;
	if (!inner) return outer;
	const transforms = [inner.transformPageChunk, outer.transformPageChunk].filter(
		(t): t is NonNullable<ResolveOptions['transformPageChunk']> => t !== undefined
	);
	return {
		transformPageChunk: async ({ html, done }) => {
			for (const transform of transforms) html = (await transform({ html, done })) ?? '';
			return html;
		},
		filterSerializedResponseHeaders:
			outer.filterSerializedResponseHeaders ?? inner.filterSerializedResponseHeaders,
		preload: outer.preload ?? inner.preload
	};
}
