/*
 * One interface for where photo files live (docs/architecture.md "Storage"): local disk by
 * default, an S3-compatible object store when configured. Both pass the same integration
 * suite (tests/integration/storage.spec.ts). Keys are ours, random, and checked here so no
 * caller can reach outside the store.
 */
export interface StoredObject {
	body: Uint8Array;
	contentType: string;
}

export interface ObjectStorage {
	readonly kind: 'disk' | 's3';
	put(key: string, body: Uint8Array, contentType: string): Promise<void>;
	/** The object, or null when there is none under that key. */
	get(key: string): Promise<StoredObject | null>;
	/** Removes the keys; a missing key is not an error. */
	delete(keys: readonly string[]): Promise<void>;
	/** Every key under a prefix (tests, clean-up). */
	list(prefix: string): Promise<string[]>;
}

/** Segments of letters, digits, '_' and '-', the last may carry dots; never '..' or a leading '/'. */
const KEY_PATTERN = /^[A-Za-z0-9_-]{1,64}(\/[A-Za-z0-9_-][A-Za-z0-9_.-]{0,63}){0,4}$/;

export function isValidKey(key: string): boolean {
	return KEY_PATTERN.test(key) && !key.split('/').some((s) => s === '..' || s === '.');
}

export function assertKey(key: string): void {
	if (!isValidKey(key)) throw new Error(`Invalid storage key: ${JSON.stringify(key)}`);
}

const TYPES: Record<string, string> = {
	avif: 'image/avif',
	webp: 'image/webp',
	jpg: 'image/jpeg',
	jpeg: 'image/jpeg',
	png: 'image/png'
};

/** The content type served for a key, from its extension; null for anything we never store. */
export function contentTypeOf(key: string): string | null {
	const ext = /\.([a-z0-9]+)$/.exec(key)?.[1];
	return ext ? (TYPES[ext] ?? null) : null;
}
