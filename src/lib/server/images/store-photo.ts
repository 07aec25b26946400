/*
 * Writes a processed photo's files to the photo store under a fresh random prefix, and
 * removes them again. Shared by services/photos.ts and the demo seed (relative imports,
 * no SvelteKit), so both store exactly the same way.
 */
import { randomBytes } from 'node:crypto';
import type { StoredVariant } from '../db/models/Photo.js';
import type { ObjectStorage } from '../storage/types.js';
import type { ProcessedPhoto } from './pipeline.js';

const EXTENSION = { avif: 'avif', webp: 'webp', jpeg: 'jpg' } as const;
const TYPE = { avif: 'image/avif', webp: 'image/webp', jpeg: 'image/jpeg' } as const;

/** 128 random bits as base64url: unguessable, so a draft's photo URL is not found by trying. */
export function newKeyPrefix(): string {
	return `photos/${randomBytes(16).toString('base64url')}`;
}

/** Where an upload's checked original waits for processing: outside `photos/`, so /media never serves it. */
export function newOriginalKey(): string {
	return `originals/${randomBytes(16).toString('base64url')}`;
}

/** A variant's key: fixed by the prefix, the width and the format, so a URL is known before the file exists. */
export function variantKey(
	keyPrefix: string,
	format: keyof typeof EXTENSION,
	width: number
): string {
	return `${keyPrefix}/${width}.${EXTENSION[format]}`;
}

export interface StoredFiles {
	keyPrefix: string;
	variants: StoredVariant[];
	bytes: number;
}

/** Puts every variant; if one fails, removes those already written and rethrows. */
export async function storeFiles(
	store: ObjectStorage,
	photo: ProcessedPhoto,
	keyPrefix = newKeyPrefix()
): Promise<StoredFiles> {
	const variants: StoredVariant[] = [];
	try {
		for (const v of photo.variants) {
			const key = variantKey(keyPrefix, v.format, v.width);
			await store.put(key, v.data, TYPE[v.format]);
			variants.push({
				format: v.format,
				width: v.width,
				height: v.height,
				key,
				bytes: v.data.byteLength
			});
		}
	} catch (e) {
		await store.delete(variants.map((v) => v.key)).catch(() => undefined);
		throw e;
	}
	return { keyPrefix, variants, bytes: variants.reduce((sum, v) => sum + v.bytes, 0) };
}

export async function removeFiles(
	store: ObjectStorage,
	variants: readonly StoredVariant[]
): Promise<void> {
	await store.delete(variants.map((v) => v.key));
}

/** Every file under a photo's prefix, including any a stopped job left half-way. */
export async function removePrefix(store: ObjectStorage, keyPrefix: string): Promise<void> {
	await store.delete(await store.list(`${keyPrefix}/`));
}
