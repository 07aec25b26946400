import { describe, expect, it } from 'vitest';
import type { Handle, RequestEvent, ResolveOptions } from '@sveltejs/kit';
import { chain } from '$lib/server/http/handle-chain';

// The documented behaviour of `sequence` from @sveltejs/kit/hooks, which chain() keeps (its
// API comment: "transformPageChunk is applied in reverse order and merged"; "preload is applied
// in forward order, the first option wins", and filterSerializedResponseHeaders likewise).
const event = { url: new URL('http://example.test/') } as unknown as RequestEvent;

describe('chain of server hooks', () => {
	it('runs hooks in order around the resolve and returns the innermost answer', async () => {
		const seen: string[] = [];
		const tag =
			(name: string): Handle =>
			async ({ event, resolve }) => {
				seen.push(`${name} in`);
				const response = await resolve(event);
				seen.push(`${name} out`);
				return response;
			};
		const handle = chain(tag('a'), tag('b'));
		const response = await handle({
			event,
			resolve: async () => {
				seen.push('resolve');
				return new Response('page');
			}
		});
		expect(await response.text()).toBe('page');
		expect(seen).toEqual(['a in', 'b in', 'resolve', 'b out', 'a out']);
	});

	it('lets a hook answer without going further', async () => {
		const handle = chain(
			async () => new Response('kept', { status: 200 }),
			async () => {
				throw new Error('must not run');
			}
		);
		const response = await handle({
			event,
			resolve: async () => new Response('never')
		});
		expect(await response.text()).toBe('kept');
	});

	it('merges resolve options as sequence does', async () => {
		let given: ResolveOptions | undefined;
		const handle = chain(
			({ event, resolve }) =>
				resolve(event, {
					transformPageChunk: ({ html }) => `${html}[outer]`,
					preload: () => true
				}),
			({ event, resolve }) =>
				resolve(event, {
					transformPageChunk: ({ html }) => `${html}[inner]`,
					preload: () => false,
					filterSerializedResponseHeaders: (name) => name === 'x-inner'
				})
		);
		await handle({
			event,
			resolve: async (_event, options) => {
				given = options;
				return new Response('');
			}
		});
		expect(await given?.transformPageChunk?.({ html: 'page', done: true })).toBe(
			'page[inner][outer]'
		);
		expect(given?.preload?.({ type: 'js', path: '/x.js' })).toBe(true);
		expect(given?.filterSerializedResponseHeaders?.('x-inner', '')).toBe(true);
	});
});
