import { beforeAll, describe, expect, it } from 'vitest';
import { checkLink, issueLink, tokenHash } from '$lib/server/newsletter/links';

/*
 * Signed newsletter links (src/lib/server/newsletter/links.ts): HMAC-SHA256 over the token's
 * body, expiry inside the signed part. Lifetimes are our own choice (common practice, no
 * published source): confirm 48 h, manage and unsubscribe 90 days.
 */
beforeAll(() => {
	process.env.AUTH_SECRET ??= 'unit-test-secret-unit-test-secret-0123456789';
});

const NOW = new Date('2026-12-08T10:00:00Z');

describe('newsletter links', () => {
	it('a fresh unsubscribe link checks out for its subscriber and link version', () => {
		const { token } = issueLink('unsubscribe', 1234, 3, NOW);
		expect(checkLink('unsubscribe', token, NOW)).toEqual({
			ok: true,
			subscriberId: 1234,
			linkVersion: 3
		});
	});

	it('expires after 90 days, and a confirm link after 48 hours', () => {
		const unsub = issueLink('unsubscribe', 1, 1, NOW);
		expect(unsub.expiresAt.toISOString()).toBe('2027-03-08T10:00:00.000Z');
		expect(checkLink('unsubscribe', unsub.token, new Date('2027-03-08T09:59:59Z')).ok).toBe(true);
		expect(checkLink('unsubscribe', unsub.token, new Date('2027-03-08T10:00:00Z'))).toEqual({
			ok: false,
			reason: 'expired'
		});
		const confirm = issueLink('confirm', 1, 1, NOW);
		expect(confirm.expiresAt.toISOString()).toBe('2026-12-10T10:00:00.000Z');
	});

	it('a changed character anywhere is refused as forged or malformed, never accepted', () => {
		const { token } = issueLink('manage', 77, 1, NOW);
		// Point the link at another subscriber (77 is "25" in base 36; 78 is "26").
		const other = token.replace(/^m\.25\./, 'm.26.');
		expect(other).not.toBe(token);
		expect(checkLink('manage', other, NOW)).toEqual({ ok: false, reason: 'forged' });
		const lastChar = token.at(-1) === 'A' ? 'B' : 'A';
		expect(checkLink('manage', token.slice(0, -1) + lastChar, NOW).ok).toBe(false);
	});

	it('a link for one purpose does not work for another', () => {
		const { token } = issueLink('manage', 5, 1, NOW);
		expect(checkLink('unsubscribe', token, NOW)).toEqual({ ok: false, reason: 'malformed' });
	});

	it('garbage and very long input are refused as malformed', () => {
		for (const bad of ['', 'abc', 'u.1.1.1.x', 'u.'.repeat(200), null, undefined])
			expect(checkLink('unsubscribe', bad as string, NOW)).toEqual({
				ok: false,
				reason: 'malformed'
			});
	});

	it('confirm links are unique and the store keeps only their SHA-256', () => {
		const a = issueLink('confirm', 9, 1, NOW);
		const b = issueLink('confirm', 9, 1, NOW);
		expect(a.token).not.toBe(b.token);
		expect(a.hash).toBe(tokenHash(a.token));
		expect(a.hash).toMatch(/^[0-9a-f]{64}$/);
	});
});
