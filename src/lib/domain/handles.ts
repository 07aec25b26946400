/*
 * Author handles: the `[handle]` of /authors/[handle]. Lower-case ASCII letters, digits and
 * single hyphens, 3–30 characters, starting with a letter and ending with a letter or digit,
 * so a handle is a readable, stable URL segment that needs no escaping anywhere.
 * Pure: the migration that gives existing accounts a handle, the User model's create hook
 * and the account form's schema share it.
 */

export const HANDLE_MIN_LENGTH = 3;
export const HANDLE_MAX_LENGTH = 30;
export const HANDLE_PATTERN = /^[a-z](?:[a-z0-9]|-(?=[a-z0-9])){1,28}[a-z0-9]$/;

/** Room left for a numeric suffix ("-12") when the plain handle is taken. */
const BASE_MAX_LENGTH = HANDLE_MAX_LENGTH - 6;

export function isHandle(value: string): boolean {
	return HANDLE_PATTERN.test(value);
}

/**
 * A handle proposal from a display name: accents dropped ("Mira Falkenberg" →
 * "mira-falkenberg", "Zoë Ång" → "zoe-ang"), anything else becomes a hyphen. Names with
 * too few Latin letters (or none) give `member`, which the caller numbers.
 */
export function handleBase(name: string | null | undefined): string {
	const words = (name ?? '')
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^[^a-z]+/, '')
		.slice(0, BASE_MAX_LENGTH)
		.replace(/-+$/, '');
	return words.length >= HANDLE_MIN_LENGTH ? words : 'member';
}

/**
 * The first free handle among base, base-2, base-3, … given the handles already taken
 * (compared lower-case). Deterministic, so a migration run twice gives the same answer.
 */
export function firstFreeHandle(base: string, taken: ReadonlySet<string>): string {
	if (!taken.has(base)) return base;
	for (let n = 2; ; n++) {
		const candidate = `${base}-${n}`;
		if (!taken.has(candidate)) return candidate;
	}
}
