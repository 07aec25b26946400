import { z } from 'zod';

/*
 * Where sign-in may send someone afterwards: a path on this site, never another origin
 * (issue 12, item 4; docs/security.md §1; ASVS v5.0.0 3.7.2).
 *
 * Checking the text ("starts with / but not //") is not enough: the URL parser that the
 * browser applies to the Location header drops tabs and newlines and reads "\" as "/", so
 * "/<TAB>/evil.example" becomes "//evil.example". So the target goes through the same
 * parser, against a stand-in origin (this check runs where the site's own origin may not be
 * known, and a relative target resolves the same way against any origin), and is kept only
 * when the origin did not change. Text that no honest link holds (control characters,
 * backslashes, anything outside Latin-1) is refused before parsing, so it can never reach a
 * header, where it would make the response fail.
 */
const STAND_IN_ORIGIN = 'https://slotwise.invalid';
const HOME = '/';

// C0 and C1 control characters, DEL, and the backslash.
// eslint-disable-next-line no-control-regex
const REFUSED_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\\]/;
// Beyond Latin-1: header values are Latin-1, and our own links are percent-encoded ASCII.
// eslint-disable-next-line no-control-regex
const BEYOND_LATIN_1 = /[^\u0000-\u00ff]/;

/** The same-origin path (with query and fragment) for `value`, or "/" for anything else. */
export function safeRedirectPath(value: unknown): string {
	if (typeof value !== 'string' || value.length === 0 || value.length > 500) return HOME;
	if (!value.startsWith('/') || REFUSED_CHARACTERS.test(value) || BEYOND_LATIN_1.test(value))
		return HOME;
	let url: URL;
	try {
		url = new URL(value, STAND_IN_ORIGIN);
	} catch {
		return HOME;
	}
	if (url.origin !== STAND_IN_ORIGIN) return HOME;
	const path = url.pathname + url.search + url.hash;
	// "//x" or "/\x" in the normalised path would be read as another host once more.
	if (!path.startsWith('/') || path.startsWith('//')) return HOME;
	return path;
}

/** A same-site path to return to after signing in; anything else falls back to home. */
export const redirectTarget = z.unknown().transform(safeRedirectPath);
