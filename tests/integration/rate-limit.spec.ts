/*
 * Rate limits on the real MariaDB (rate_limits table in slotwise_test). Thresholds are the
 * module's own policy (common practice, no published source), read through policyOf() so the
 * tests follow a deliberate change of numbers but still check that the limit bites exactly there.
 */
import { createServer, type Server, type Socket } from 'node:net';
import { QueryTypes } from 'sequelize';
import { afterAll, afterEach, beforeEach, describe, expect, it } from 'vitest';
import { sequelize } from '../../src/lib/server/db';
import { dbConfigFromEnv } from '../../src/lib/server/db/connection';
import {
	addressKey,
	closeRateLimits,
	consume,
	consumeAll,
	createRateLimits,
	FAIL_CLOSED_RETRY_AFTER_SECONDS,
	joinKey,
	normaliseKey,
	peek,
	policyOf,
	refund,
	reset,
	type LimiterName,
	type RateLimits,
	type StoreErrorLog
} from '../../src/lib/server/rate-limit';
import { resetDatabase } from '../support/db';

const IP = '203.0.113.7'; // TEST-NET-3 (RFC 5737)
const OTHER_IP = '198.51.100.9'; // TEST-NET-2

async function spend(
	limiter: LimiterName,
	key: string,
	times: number,
	via: RateLimits['consume'] = consume
) {
	const results = [];
	for (let i = 0; i < times; i++) results.push(await via(limiter, key));
	return results;
}

async function storedKeys(): Promise<string[]> {
	const rows = await sequelize.query<{ key: string }>(
		'SELECT `key` FROM rate_limits ORDER BY `key`',
		{
			type: QueryTypes.SELECT
		}
	);
	return rows.map((r) => r.key);
}

beforeEach(resetDatabase);
afterAll(closeRateLimits);

describe('thresholds', () => {
	it('lets sign-ups through up to the limit and refuses the next one until the window ends', async () => {
		const { points, durationSeconds } = policyOf('signUp');
		const allowed = await spend('signUp', IP, points);
		expect(allowed.every((r) => r.ok)).toBe(true);

		const refused = await consume('signUp', IP);
		expect(refused.ok).toBe(false);
		if (refused.ok) return;
		expect(refused.retryAfterSeconds).toBeGreaterThan(durationSeconds - 10);
		expect(refused.retryAfterSeconds).toBeLessThanOrEqual(durationSeconds);
		// The count lives in the shared table, not in this process.
		expect(await storedKeys()).toEqual([`signup_addr:${IP}`]);
	});

	it('blocks an account+address pair for the block time after too many failed sign-ins', async () => {
		const { points, blockSeconds } = policyOf('signInByAccountAndAddress');
		const key = joinKey(IP, 'reader@example.test');
		expect((await spend('signInByAccountAndAddress', key, points)).every((r) => r.ok)).toBe(true);

		const refused = await consume('signInByAccountAndAddress', key);
		expect(refused).toEqual({ ok: false, retryAfterSeconds: blockSeconds });
		// Further attempts during the block stay refused and don't extend it.
		const again = await consume('signInByAccountAndAddress', key);
		expect(again.ok).toBe(false);
		if (!again.ok) expect(again.retryAfterSeconds).toBeLessThanOrEqual(blockSeconds);
	});

	it('applies every named limit at its own threshold', async () => {
		const names: LimiterName[] = [
			'signInByAddress',
			'emailLinkByEmail',
			'emailLinkByAddress',
			'passwordResetByEmail',
			'passwordResetByAddress',
			// Issue 12, item 12: floods of address changes, forks and new guides.
			'emailChangeByUser',
			'emailChangeByEmail',
			'forkByUser',
			'guideCreateByUser'
		];
		for (const name of names) {
			const { points } = policyOf(name);
			const results = await spend(name, `${name}-key`, points + 1);
			expect(results.filter((r) => r.ok)).toHaveLength(points);
			expect(results.at(-1)?.ok, name).toBe(false);
		}
	});

	it('opens a spent window again once it has expired', async () => {
		const { points } = policyOf('emailLinkByEmail');
		await spend('emailLinkByEmail', 'reader@example.test', points + 1);
		expect((await consume('emailLinkByEmail', 'reader@example.test')).ok).toBe(false);

		// Instead of waiting 15 minutes, move the stored expiry into the past.
		await sequelize.query('UPDATE rate_limits SET expire = ?', {
			replacements: [Date.now() - 1_000],
			type: QueryTypes.UPDATE
		});
		expect(await consume('emailLinkByEmail', 'reader@example.test')).toEqual({ ok: true });
	});
});

describe('keys', () => {
	it('keeps addresses, e-mails and limiters apart', async () => {
		const { points } = policyOf('signInByAccountAndAddress');
		const victim = joinKey(IP, 'owner@example.test');
		await spend('signInByAccountAndAddress', victim, points + 1);
		expect((await consume('signInByAccountAndAddress', victim)).ok).toBe(false);

		// Same account from another address, another account from the same address.
		expect(
			await consume('signInByAccountAndAddress', joinKey(OTHER_IP, 'owner@example.test'))
		).toEqual({
			ok: true
		});
		expect(await consume('signInByAccountAndAddress', joinKey(IP, 'other@example.test'))).toEqual({
			ok: true
		});
		// Another limiter on the same address.
		expect(await consume('signInByAddress', IP)).toEqual({ ok: true });
		expect(await consume('signUp', IP)).toEqual({ ok: true });
	});

	it('counts e-mail case and full-width variants as the same key', async () => {
		const { points } = policyOf('passwordResetByEmail');
		const variants = [
			'Reader@Example.test',
			' reader@example.test',
			'READER@EXAMPLE.TEST',
			'reader＠example.test'
		];
		for (let i = 0; i < points; i++) {
			expect((await consume('passwordResetByEmail', variants[i % variants.length] ?? '')).ok).toBe(
				true
			);
		}
		expect((await consume('passwordResetByEmail', 'reader@example.test')).ok).toBe(false);
		expect(await storedKeys()).toEqual(['reset_email:reader@example.test']);
	});

	it('hashes long keys so they fit the column, and still counts them', async () => {
		const { points } = policyOf('emailLinkByEmail');
		const long = `${'a'.repeat(5_000)}@example.test`;
		const longToo = `${'a'.repeat(5_000)}@example.tesx`; // same first 160 characters

		const results = await spend('emailLinkByEmail', long, points + 1);
		expect(results.filter((r) => r.ok)).toHaveLength(points);
		expect(results.at(-1)?.ok).toBe(false);
		expect(await consume('emailLinkByEmail', longToo)).toEqual({ ok: true });

		const keys = await storedKeys();
		expect(keys).toHaveLength(2);
		for (const key of keys) {
			expect(key).toMatch(/^link_email:sha256:[0-9a-f]{64}$/);
			expect(key.length).toBeLessThanOrEqual(255);
		}
		// A short key that imitates a hashed one can't reach that counter.
		const imitation = normaliseKey(long);
		expect(normaliseKey(imitation)).not.toBe(imitation);
		expect(await consume('emailLinkByEmail', imitation)).toEqual({ ok: true });
	});

	it('counts IPv6 clients by /64 and IPv4-mapped addresses as IPv4', () => {
		expect(addressKey('2001:db8:1:2:aaaa::1')).toBe(addressKey('2001:DB8:1:2:bbbb:cccc:dddd:eeee'));
		expect(addressKey('2001:db8:1:2::1')).not.toBe(addressKey('2001:db8:1:3::1'));
		expect(addressKey('::ffff:203.0.113.7')).toBe(IP);
		expect(addressKey(IP)).toBe(IP);
	});
});

describe('peek and reset', () => {
	it('peek reports blocked only when the next consume would be refused, without counting', async () => {
		const { points } = policyOf('signInByAccountAndAddress');
		const key = joinKey(IP, 'reader@example.test');
		expect(await peek('signInByAccountAndAddress', key)).toEqual({
			blocked: false,
			retryAfterSeconds: 0
		});

		await spend('signInByAccountAndAddress', key, points - 1);
		for (let i = 0; i < 5; i++) {
			expect((await peek('signInByAccountAndAddress', key)).blocked).toBe(false);
		}
		expect(await consume('signInByAccountAndAddress', key)).toEqual({ ok: true });

		const blocked = await peek('signInByAccountAndAddress', key);
		expect(blocked.blocked).toBe(true);
		expect(blocked.retryAfterSeconds).toBeGreaterThan(0);
		expect((await consume('signInByAccountAndAddress', key)).ok).toBe(false);
	});

	it('reset clears a key (e.g. after a successful sign-in) and leaves others alone', async () => {
		const { points } = policyOf('signInByAccountAndAddress');
		const key = joinKey(IP, 'reader@example.test');
		const other = joinKey(OTHER_IP, 'reader@example.test');
		await spend('signInByAccountAndAddress', key, points + 1);
		await spend('signInByAccountAndAddress', other, points + 1);

		await reset('signInByAccountAndAddress', joinKey(IP, 'Reader@Example.test'));
		expect((await peek('signInByAccountAndAddress', key)).blocked).toBe(false);
		expect(await consume('signInByAccountAndAddress', key)).toEqual({ ok: true });
		expect((await peek('signInByAccountAndAddress', other)).blocked).toBe(true);
	});

	it('refund gives one point back, so a successful sign-in does not count against the address', async () => {
		const { points } = policyOf('signInByAddress');
		await spend('signInByAddress', IP, points - 1);
		await refund('signInByAddress', IP);
		await refund('signInByAddress', IP);
		// points - 1 spent, 2 given back: 3 more fit before the limit.
		expect((await spend('signInByAddress', IP, 3)).every((r) => r.ok)).toBe(true);
		expect((await consume('signInByAddress', IP)).ok).toBe(false);
	});

	it('consumeAll stops at the first refusal, so a blocked address spends no e-mail budget', async () => {
		const { points } = policyOf('emailLinkByAddress');
		await spend('emailLinkByAddress', IP, points);
		const refused = await consumeAll([
			['emailLinkByAddress', IP],
			['emailLinkByEmail', 'owner@example.test']
		]);
		expect(refused.ok).toBe(false);
		expect(await storedKeys()).toEqual([`link_addr:${IP}`]);

		expect(
			await consumeAll([
				['emailLinkByAddress', OTHER_IP],
				['emailLinkByEmail', 'owner@example.test']
			])
		).toEqual({ ok: true });
	});
});

describe('several app instances', () => {
	let a: RateLimits;
	let b: RateLimits;
	beforeEach(() => {
		a = createRateLimits({ ...dbConfigFromEnv() });
		b = createRateLimits({ ...dbConfigFromEnv() });
	});
	afterEach(async () => {
		await Promise.all([a.close(), b.close()]);
	});

	it('share one count through the table', async () => {
		const { points } = policyOf('signUp');
		for (let i = 0; i < points; i++) {
			expect((await (i % 2 === 0 ? a : b).consume('signUp', IP)).ok).toBe(true);
		}
		expect((await a.consume('signUp', IP)).ok).toBe(false);
		expect((await b.consume('signUp', IP)).ok).toBe(false);
		await a.reset('signUp', IP);
		expect((await b.peek('signUp', IP)).blocked).toBe(false);
	});

	it('never let more than the limit through when attempts race on both', async () => {
		const { points } = policyOf('emailLinkByAddress');
		const attempts = Array.from({ length: points + 15 }, (_, i) =>
			(i % 2 === 0 ? a : b).consume('emailLinkByAddress', IP)
		);
		const results = await Promise.all(attempts);
		expect(results.filter((r) => r.ok)).toHaveLength(points);
	});
});

describe('when the store is unreachable', () => {
	it('fails closed within 3 s, and logs the outage once', async () => {
		const logged: StoreErrorLog[] = [];
		const down = createRateLimits({
			...dbConfigFromEnv(),
			port: 1,
			logStoreError: (e) => logged.push(e)
		});
		try {
			const started = Date.now();
			// Refused, and marked as an outage so the answer is a 503, not "too many attempts".
			expect(await down.consume('signUp', IP)).toEqual({
				ok: false,
				retryAfterSeconds: FAIL_CLOSED_RETRY_AFTER_SECONDS,
				storeDown: true
			});
			expect(Date.now() - started).toBeLessThan(3_000);

			expect(
				await down.peek('signInByAccountAndAddress', joinKey(IP, 'reader@example.test'))
			).toEqual({
				blocked: true,
				retryAfterSeconds: FAIL_CLOSED_RETRY_AFTER_SECONDS
			});
			await expect(down.reset('signInByAccountAndAddress', IP)).resolves.toBeUndefined();
			expect((await down.consume('emailLinkByEmail', 'reader@example.test')).ok).toBe(false);

			expect(logged).toHaveLength(1);
			expect(logged[0]).toMatchObject({ kind: 'rate-limit-store-down', limiter: 'signUp' });
			expect(JSON.stringify(logged)).not.toContain(IP);
		} finally {
			await down.close();
		}
	});

	it('fails closed within 3 s when the server accepts but never answers', async () => {
		// A real TCP listener that swallows everything: the hung-database case.
		const sockets = new Set<Socket>();
		const silent: Server = createServer((socket) => {
			sockets.add(socket);
			socket.on('error', () => undefined);
		});
		await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve));
		const address = silent.address();
		const port = typeof address === 'object' && address ? address.port : 0;
		const hung = createRateLimits({ ...dbConfigFromEnv(), port, logStoreError: () => undefined });
		try {
			const started = Date.now();
			expect(await hung.consume('signInByAddress', IP)).toEqual({
				ok: false,
				retryAfterSeconds: FAIL_CLOSED_RETRY_AFTER_SECONDS,
				storeDown: true
			});
			expect(Date.now() - started).toBeLessThan(3_000);
		} finally {
			for (const socket of sockets) socket.destroy();
			await hung.close();
			await new Promise<void>((resolve) => silent.close(() => resolve()));
		}
	});
});
