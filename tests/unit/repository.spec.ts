import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { migrations } from '../../src/lib/server/db/migrations/index';

/*
 * The repository stands alone, and the hand-kept migration list matches its folder.
 */
const ROOT = resolve(import.meta.dirname, '../..');

function filesUnder(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? filesUnder(path) : [path];
	});
}

describe('the repository stands alone', () => {
	const sources = ['src', 'tests', 'scripts', 'bench']
		.flatMap((d) => filesUnder(join(ROOT, d)))
		.filter((f) => /\.(ts|js|mjs|svelte|svx|sh|md)$/.test(f));

	it('every Markdown file a comment or test names exists in the repository', () => {
		const missing: string[] = [];
		for (const file of sources) {
			const text = readFileSync(file, 'utf8');
			for (const match of text.matchAll(/\b((?:docs\/)?[A-Za-z0-9_-]+\.md)\b/g)) {
				const name = match[1] ?? '';
				const target = name.includes('/') ? join(ROOT, name) : join(ROOT, name);
				if (!existsSync(target) && !existsSync(join(ROOT, 'docs', name)))
					missing.push(`${relative(ROOT, file)} → ${name}`);
			}
		}
		expect(missing).toEqual([]);
	});

	it('nothing points outside the repository for its design notes', () => {
		const outside = sources.filter((file) => /\.\.\/shared\b/.test(readFileSync(file, 'utf8')));
		expect(outside.map((f) => relative(ROOT, f))).toEqual([]);
	});
});

describe('migrations/index.ts', () => {
	const folder = join(ROOT, 'src/lib/server/db/migrations');
	const files = readdirSync(folder)
		.filter((f) => /^\d{4}\.\d{2}\.\d{2}T\d{2}\.\d{2}\.\d{2}\..+\.ts$/.test(f))
		.map((f) => f.replace(/\.ts$/, ''))
		.sort();

	it('lists every migration file of the folder, once, in timestamp order', () => {
		expect(Object.keys(migrations)).toEqual(files);
	});

	it('imports each entry from the file of the same name', () => {
		const text = readFileSync(join(folder, 'index.ts'), 'utf8');
		const fileOf = new Map(
			[...text.matchAll(/import \* as (\w+) from '\.\/(.+)\.js';/g)].map((m) => [m[1], m[2]])
		);
		const entries = [...text.matchAll(/'([^']+)': (\w+)/g)].map((m) => [
			m[1],
			fileOf.get(m[2] ?? '')
		]);
		expect(entries.length).toBe(files.length);
		for (const [name, file] of entries) expect(file).toBe(name);
	});
});
