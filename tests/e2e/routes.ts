import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';

/*
 * The routes under src/routes as the tests that walk all of them see them: the
 * authorization matrix (authorization-matrix.e2e.ts), the content-type check and the fuzz
 * suite (fuzz.e2e.ts). An entry is "METHOD /route-id" or "POST /route-id?/action".
 */

/*
 * Per-route samples where SAMPLE_PARAMS would name the wrong kind of record: its slug is a
 * guide's, which a part route answers with 404. A demo part's slug makes "ok" mean
 * "authorized and found" for the public part page and API (the seeded e2e database has it).
 */
export const ROUTE_PARAMS: Record<string, Record<string, string>> = {
	'/(public)/parts/[slug=slug]': { slug: 'solenne-cobalt-c6-8g' },
	'/api/v1/parts/[slug=slug]': { slug: 'solenne-cobalt-c6-8g' },
	'/(editor)/editor/parts/[slug=slug]': { slug: 'solenne-cobalt-c6-8g' },
	'/(editor)/editor/regions/[code]': { code: 'us' },
	'/(editor)/editor/cautions/[id=id]': { id: '1' },
	'/(editor)/review/[id=id]': { id: '1' },
	'/(public)/authors/[handle]': { handle: 'priya-lindqvist' },
	'/(editor)/editor/mailings/[id=id]': { id: '999999' },
	'/(editor)/editor/mailings/[id=id]/progress': { id: '999999' },
	'/(public)/builds/[id=id]': { id: '999999' },
	'/(public)/builds/[id=id]/print': { id: '999999' },
	'/(public)/builds/[id=id]/export.csv': { id: '999999' },
	// No build has this id in the seeded database (the id matcher refuses the UUID sample).
	'/api/v1/builds/[id=id]/sync': { id: '999999' },
	'/api/v1/builds/[id=id]': { id: '999999' },
	'/api/v1/builds/[id=id]/slots': { id: '999999' },
	'/api/v1/builds/[id=id]/slots/[slotId=id]': { id: '999999', slotId: '999999' },
	'/api/v1/builds/[id=id]/export.csv': { id: '999999' },
	// The demo author's guide, and a photo id no photo has.
	'/api/v1/guides/[slug=slug]/photos/[id=id]': { slug: 'steady-1080p-starter', id: '999999' }
};

export const SAMPLE_PARAMS: Record<string, string> = {
	slug: 'steady-1080p-starter',
	token: 'a'.repeat(43),
	id: '00000000-0000-0000-0000-000000000000'
};

const ROUTES_DIR = resolve(import.meta.dirname, '../../src/routes');

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? walk(path) : [path];
	});
}

/** Every page (GET), form action (POST ?/name) and endpoint method under src/routes. */
export function discoverRoutes(): string[] {
	const found = new Set<string>();
	for (const file of walk(ROUTES_DIR)) {
		const routeId = '/' + relative(ROUTES_DIR, join(file, '..')).split('\\').join('/');
		const id = routeId === '/' ? '/' : routeId.replace(/\/$/, '');
		const name = file.split('/').pop() ?? '';
		const source = readFileSync(file, 'utf8');
		if (name === '+page.svelte' || name === '+page.svx') found.add(`GET ${id}`);
		if (name === '+page.server.ts') {
			const block = /export const actions[^=]*=\s*\{([\s\S]*?)\n\};/.exec(source)?.[1] ?? '';
			for (const m of block.matchAll(/^\t(\w+):/gm)) found.add(`POST ${id}?/${m[1]}`);
		}
		if (name === '+server.ts') {
			for (const m of source.matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g))
				found.add(`${m[1]} ${id}`);
		}
	}
	return [...found].sort();
}

export function urlOf(entry: string): { method: string; url: string } {
	const [method = 'GET', target = '/'] = entry.split(' ');
	const [routeId = '/', action] = target.split('?/');
	const path =
		routeId
			.split('/')
			.filter((segment) => segment && !/^\(.+\)$/.test(segment))
			.map((segment) =>
				segment.replace(
					/^\[(\w+)(=\w+)?\]$/,
					(_, p: string) => ROUTE_PARAMS[routeId]?.[p] ?? SAMPLE_PARAMS[p] ?? 'x'
				)
			)
			.join('/') || '';
	const url = `/${path}` + (action ? (action === 'default' ? '' : `?/${action}`) : '');
	return { method, url };
}

/** Form actions only: every `POST …?/name` entry. */
export function discoverActions(): string[] {
	return discoverRoutes().filter((entry) => entry.startsWith('POST ') && entry.includes('?/'));
}
