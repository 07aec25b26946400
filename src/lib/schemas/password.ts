import { dictionary } from '@zxcvbn-ts/language-common';
import { z } from 'zod';

/*
 * Password rules per NIST SP 800-63B-4 §3.1.1.2 (docs/sources.md 13a, V2): at least 15
 * characters for a single-factor password, at least 64 allowed (we allow 256), no
 * composition rules, no truncation, each Unicode code point counts as one character,
 * and a blocklist of commonly used passwords — here the ~49,000-entry common-password
 * list shipped with zxcvbn-ts (@zxcvbn-ts/language-common).
 */
export const PASSWORD_MIN_CHARS = 15;
export const PASSWORD_MAX_CHARS = 256;

const COMMON = new Set(dictionary['passwords-common'].map((p) => p.toLowerCase()));

/** Length in code points, as NIST asks (an emoji is one character, not two UTF-16 units). */
export function passwordLength(password: string): number {
	return [...password.normalize('NFKC')].length;
}

export function isCommonPassword(password: string): boolean {
	return COMMON.has(password.normalize('NFKC').toLowerCase());
}

/** A password being chosen (sign-up, reset, change). */
export const newPassword = z
	.string()
	.refine((p) => passwordLength(p) >= PASSWORD_MIN_CHARS, {
		message: `Use at least ${PASSWORD_MIN_CHARS} characters. A few unrelated words make a good one.`
	})
	.refine((p) => passwordLength(p) <= PASSWORD_MAX_CHARS, {
		message: `Use at most ${PASSWORD_MAX_CHARS} characters.`
	})
	.refine((p) => !isCommonPassword(p), {
		message: 'This password is on a list of commonly used passwords. Choose another.'
	});

/** A password being checked (sign-in): only bounded, never judged, so old ones still work. */
export const existingPassword = z
	.string()
	.min(1, 'Enter your password.')
	.max(1024, 'That password is too long.');
