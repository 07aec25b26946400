import { describe, expect, it } from 'vitest';
import { classifySmtpError, mayRetry, retryDelayMs } from '$lib/domain/mail-delivery';

/*
 * RFC 5321 §4.2.1 reply classes (docs/sources.md 12b, V2): 4yz transient negative completion
 * ("the action did not occur … may be requested again"), 5yz permanent negative completion.
 */
describe('what an SMTP failure means for a queued message', () => {
	it('550 mailbox unavailable is permanent (5yz, docs/sources.md 12b)', () => {
		expect(classifySmtpError({ responseCode: 550, message: '550 No such user' })).toEqual({
			kind: 'permanent',
			code: 550,
			reason: '550 No such user'
		});
	});

	it('554 transaction failed is permanent (5yz)', () => {
		expect(classifySmtpError({ responseCode: 554 }).kind).toBe('permanent');
	});

	it('451 local error and 421 service not available are temporary (4yz)', () => {
		expect(classifySmtpError({ responseCode: 451 }).kind).toBe('temporary');
		expect(classifySmtpError({ responseCode: 421 }).kind).toBe('temporary');
	});

	it('a refused connection is temporary: nothing reached any server', () => {
		expect(
			classifySmtpError({
				code: 'ESOCKET',
				originalCode: 'ECONNREFUSED',
				message: 'connect ECONNREFUSED'
			}).kind
		).toBe('temporary');
		expect(classifySmtpError({ code: 'EDNS', message: 'getaddrinfo ENOTFOUND' }).kind).toBe(
			'temporary'
		);
	});

	it('a connection that broke without an answer is unknown: it may have been delivered', () => {
		expect(classifySmtpError({ code: 'ETIMEDOUT', message: 'Timeout' }).kind).toBe('unknown');
		expect(
			classifySmtpError({ code: 'ECONNECTION', message: 'Connection closed unexpectedly' }).kind
		).toBe('unknown');
	});

	it('keeps the stored reason to one line of at most 280 characters', () => {
		const reason = classifySmtpError({
			responseCode: 550,
			message: `550\r\n${'x'.repeat(400)}`
		}).reason;
		expect(reason).not.toMatch(/[\r\n]/);
		expect(reason).toHaveLength(280);
	});
});

describe('back-off (common practice, no published source)', () => {
	const policy = { baseMs: 60_000, maxMs: 7_200_000, maxAttempts: 8 };

	it('doubles from one minute: 1, 2, 4, 8, 16, 32, 64 minutes, capped at two hours', () => {
		expect([1, 2, 3, 4, 5, 6, 7, 8].map((n) => retryDelayMs(n, policy) / 60_000)).toEqual([
			1, 2, 4, 8, 16, 32, 64, 120
		]);
	});

	it('allows attempts up to the maximum and no more', () => {
		expect(mayRetry(7, policy)).toBe(true);
		expect(mayRetry(8, policy)).toBe(false);
	});
});
