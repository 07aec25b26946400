/*
 * Photo files on local disk (the default): one file per key under a root folder outside
 * `static/` (.data/uploads), written to a temporary name and renamed, so a reader never
 * sees half a file. The content type is derived from the key's extension.
 */
import { mkdir, readFile, readdir, rename, rm, rmdir, writeFile } from 'node:fs/promises';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { randomBytes } from 'node:crypto';
import { assertKey, contentTypeOf } from './types.js';
import type { ObjectStorage } from './types.js';

export function diskStorage(root: string): ObjectStorage {
	const base = resolve(root);
	const pathOf = (key: string) => {
		assertKey(key);
		const path = resolve(base, key);
		// assertKey already forbids '..'; this is the belt to its braces.
		if (!path.startsWith(base + sep)) throw new Error('Storage key escapes the root');
		return path;
	};

	return {
		kind: 'disk',

		async put(key, body) {
			const path = pathOf(key);
			await mkdir(dirname(path), { recursive: true });
			const temporary = `${path}.${randomBytes(6).toString('hex')}.part`;
			await writeFile(temporary, body);
			await rename(temporary, path);
		},

		async get(key) {
			const path = pathOf(key);
			try {
				const body = await readFile(path);
				return { body, contentType: contentTypeOf(key) ?? 'application/octet-stream' };
			} catch (e) {
				if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
				throw e;
			}
		},

		async delete(keys) {
			const folders = new Set<string>();
			for (const key of keys) {
				const path = pathOf(key);
				await rm(path, { force: true });
				folders.add(dirname(path));
			}
			// A photo's folder goes when its last file does; a folder still in use stays.
			for (const folder of folders) {
				if (folder === base) continue;
				await rmdir(folder).catch(() => undefined);
			}
		},

		async list(prefix) {
			const found: string[] = [];
			async function walk(dir: string) {
				let entries;
				try {
					entries = await readdir(dir, { withFileTypes: true });
				} catch (e) {
					if ((e as NodeJS.ErrnoException).code === 'ENOENT') return;
					throw e;
				}
				for (const entry of entries) {
					const path = join(dir, entry.name);
					if (entry.isDirectory()) await walk(path);
					else if (!entry.name.endsWith('.part'))
						found.push(relative(base, path).split(sep).join('/'));
				}
			}
			await walk(base);
			return found.filter((k) => k.startsWith(prefix)).sort();
		}
	};
}
