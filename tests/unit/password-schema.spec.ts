import { describe, expect, it } from 'vitest';
import { isCommonPassword, newPassword, passwordLength } from '$lib/schemas/password';

/*
 * NIST SP 800-63B-4 §3.1.1.2 (final 2025; docs/sources.md 13a, status V2 — read through
 * quoting secondaries): minimum 15 characters for single-factor passwords, at least 64
 * allowed, no composition rules, blocklist of common passwords, code point = 1 character.
 */
describe('new password rules (NIST SP 800-63B-4 §3.1.1.2, V2)', () => {
	it('refuses 14 characters and accepts 15', () => {
		expect(newPassword.safeParse('a'.repeat(6) + 'b'.repeat(8)).success).toBe(false);
		expect(newPassword.safeParse('walnut lantern q').success).toBe(true);
	});

	it('accepts a 64-character password (at least 64 must be allowed)', () => {
		const long = 'copper teal paper ink rule slot guide build fork sync drift xyz!';
		expect(long.length).toBe(64);
		expect(newPassword.safeParse(long).success).toBe(true);
	});

	it('imposes no composition rules: lower-case words alone pass', () => {
		expect(newPassword.safeParse('quiet orchard ferry').success).toBe(true);
	});

	it('counts code points, not UTF-16 units: 15 emoji are 15 characters', () => {
		const emoji = '🔧'.repeat(15);
		expect(emoji.length).toBe(30);
		expect(passwordLength(emoji)).toBe(15);
		expect(newPassword.safeParse('🔧'.repeat(14)).success).toBe(false);
	});

	it('refuses passwords on the common-password blocklist, case-insensitively', () => {
		// '1qaz2wsx3edc4rfv' is a keyboard walk in the zxcvbn-ts common list (16 chars).
		expect(isCommonPassword('1qaz2wsx3edc4rfv')).toBe(true);
		expect(isCommonPassword('1QAZ2WSX3EDC4RFV')).toBe(true);
		const result = newPassword.safeParse('1qaz2wsx3edc4rfv');
		expect(result.success).toBe(false);
		expect(result.error?.issues[0]?.message).toMatch(/commonly used/);
	});

	it('refuses more than 256 characters with a clear message', () => {
		const result = newPassword.safeParse('x'.repeat(257));
		expect(result.success).toBe(false);
		expect(result.error?.issues[0]?.message).toMatch(/at most 256/);
	});
});
