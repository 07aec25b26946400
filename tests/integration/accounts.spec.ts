import { createServer, type AddressInfo, type Socket } from 'node:net';
import { QueryTypes } from 'sequelize';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { runLater, settled } from '../../src/lib/server/background';
import { EmailToken, Guide, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import * as guides from '../../src/lib/server/services/guides';
import { closeTransport } from '../../src/lib/server/mail';
import * as accounts from '../../src/lib/server/services/accounts';
import { resetDatabase } from '../support/db';
import { firstLink, waitForMessage } from '../support/mailbox';

/*
 * Accounts on the real MariaDB, with e-mail over real SMTP to the local fake
 * (`npm test` starts it and sets MAILBOX_URL).
 */
/*
 * Work the services defer (runLater) may reach MariaDB before or after the test reads the
 * statement counters, depending on which pooled connection answers first. While `held` is
 * true the deferred jobs wait in a list, so a measurement counts only what ran before the
 * answer; `release()` hands them to the real scheduler afterwards.
 */
const deferred = vi.hoisted(() => ({
	held: false,
	jobs: [] as Array<[string, () => Promise<unknown>]>
}));
vi.mock('../../src/lib/server/background', async (importOriginal) => {
	const actual = await importOriginal<typeof import('../../src/lib/server/background')>();
	return {
		...actual,
		runLater(label: string, job: () => Promise<unknown>) {
			if (deferred.held) deferred.jobs.push([label, job]);
			else actual.runLater(label, job);
		}
	};
});

function release() {
	deferred.held = false;
	for (const [label, job] of deferred.jobs.splice(0)) runLater(label, job);
}

const ORIGIN = 'http://127.0.0.1:4173';
const PASSWORD = 'lantern orchard ferry north';

function tokenFrom(link: string): string {
	const url = new URL(link);
	return url.searchParams.get('token') ?? url.pathname.split('/').pop() ?? '';
}

async function signUpAndVerify(email: string) {
	await accounts.signUp({ name: 'Test Person', email, password: PASSWORD }, ORIGIN);
	const link = firstLink(await waitForMessage({ to: email, subject: /confirm/i }), '/verify');
	expect(await accounts.verifyEmail(tokenFrom(link))).toBe('verified');
}

describe('accounts service', () => {
	beforeEach(resetDatabase);
	// Accounts answer first and write rows and send mail afterwards (issue 12, item 8).
	afterEach(settled);

	it('signs up an unverified reader with an argon2id hash, and only verification opens sign-in', async () => {
		const email = `new-${Date.now()}@example.test`;
		await accounts.signUp({ name: 'Nell', email, password: PASSWORD }, ORIGIN);
		await settled();
		const user = await User.findOne({ where: { email } });
		expect(user?.role).toBe('reader');
		expect(user?.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
		expect(await accounts.authenticate(email, PASSWORD)).toBeNull();

		const link = firstLink(await waitForMessage({ to: email, subject: /confirm/i }), '/verify');
		expect(await accounts.verifyEmail(tokenFrom(link))).toBe('verified');
		expect(await accounts.authenticate(email, PASSWORD)).toMatchObject({ email, role: 'reader' });
		// Single use.
		expect(await accounts.verifyEmail(tokenFrom(link))).toBe('invalid');
	});

	it('stores only token hashes, never the token sent by mail', async () => {
		const email = `hash-${Date.now()}@example.test`;
		await accounts.signUp({ name: 'Hal', email, password: PASSWORD }, ORIGIN);
		const token = tokenFrom(
			firstLink(await waitForMessage({ to: email, subject: /confirm/i }), '/verify')
		);
		const rows = await EmailToken.findAll();
		expect(rows).toHaveLength(1);
		expect(rows[0]?.tokenHash).toMatch(/^[0-9a-f]{64}$/);
		expect(rows[0]?.tokenHash).not.toContain(token);
	});

	it('answers a sign-up for a taken address like any other, and mails the owner instead', async () => {
		const email = `taken-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		const before = await User.count();
		expect(
			await accounts.signUp(
				{ name: 'Imposter', email, password: 'other long passphrase here' },
				ORIGIN
			)
		).toEqual({ kind: 'ok' });
		await settled();
		expect(await User.count()).toBe(before);
		await waitForMessage({ to: email, subject: /already|account/i });
		// The owner's password is unchanged.
		expect(await accounts.authenticate(email, PASSWORD)).not.toBeNull();
	});

	it('gives the same null for unknown address, wrong password and disabled account', async () => {
		const email = `who-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		expect(await accounts.authenticate('nobody@example.test', PASSWORD)).toBeNull();
		expect(await accounts.authenticate(email, 'wrong but long password')).toBeNull();
		await User.update({ disabledAt: new Date() }, { where: { email } });
		expect(await accounts.authenticate(email, PASSWORD)).toBeNull();
	});

	it('resets a password by link: old sessions end, the link works once and expires after 10 minutes', async () => {
		const email = `reset-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		const user = await User.findOne({ where: { email } });
		if (!user) throw new Error('user missing');
		expect(await accounts.sessionUser(user.id, user.sessionVersion)).not.toBeNull();

		await accounts.requestPasswordReset(email, ORIGIN);
		const token = tokenFrom(
			firstLink(await waitForMessage({ to: email, subject: /reset/i }), '/reset/')
		);
		const newPassword = 'copper hills at first light';
		expect(await accounts.resetPassword(token, newPassword)).toBe('reset');
		expect(await accounts.resetPassword(token, 'yet another long password')).toBe('invalid');
		expect(await accounts.authenticate(email, newPassword)).not.toBeNull();
		expect(await accounts.authenticate(email, PASSWORD)).toBeNull();
		// The session issued before the reset carries the old version: refused.
		expect(await accounts.sessionUser(user.id, user.sessionVersion)).toBeNull();

		// ASVS 6.5.5: out-of-band links expire within 10 minutes. Age a fresh one by 11.
		await accounts.requestPasswordReset(email, ORIGIN);
		const messages = await waitForMessage({ to: email, subject: /reset/i });
		const fresh = tokenFrom(firstLink(messages, '/reset/'));
		await EmailToken.update(
			{ expiresAt: new Date(Date.now() - 60_000) },
			{ where: { usedAt: null } }
		);
		expect(await accounts.isResetTokenUsable(fresh)).toBe(false);
		expect(await accounts.resetPassword(fresh, 'one more long password')).toBe('invalid');
	});

	it('issues reset tokens that expire 10 minutes after they are made', async () => {
		const email = `ttl-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		const before = Date.now();
		await accounts.requestPasswordReset(email, ORIGIN);
		await settled();
		const row = await EmailToken.findOne({ where: { purpose: 'reset_password' } });
		const minutes = ((row?.expiresAt.getTime() ?? 0) - before) / 60_000;
		expect(minutes).toBeGreaterThan(9.9);
		expect(minutes).toBeLessThanOrEqual(10.01);
	});

	it('sends no reset mail for an unknown address and says nothing different', async () => {
		await expect(
			accounts.requestPasswordReset('nobody-here@example.test', ORIGIN)
		).resolves.toBeUndefined();
		await settled();
		expect(await EmailToken.count()).toBe(0);
		await expect(
			waitForMessage({ to: 'nobody-here@example.test', timeoutMs: 500 })
		).rejects.toThrow(/No e-mail/);
	});

	it('changes a password only with the current one, and ends older sessions', async () => {
		const email = `change-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		const user = await User.findOne({ where: { email } });
		if (!user) throw new Error('user missing');
		expect(
			await accounts.changePassword(user.id, 'not my password at all', 'brand new long password')
		).toEqual({ kind: 'wrong_password' });
		expect(await accounts.changePassword(user.id, PASSWORD, 'brand new long password')).toEqual({
			kind: 'ok'
		});
		expect(await accounts.sessionUser(user.id, user.sessionVersion)).toBeNull();
		expect(await accounts.sessionUser(user.id, user.sessionVersion + 1)).toMatchObject({ email });
	});

	it('deletes an account but keeps its published guides, shown under "Former member"', async () => {
		await seedDemoCommunity(sequelize);
		const author = await User.findOne({ where: { email: 'author@slotwise.test' } });
		if (!author) throw new Error('demo author missing');
		const owned = await Guide.findAll({ where: { authorId: author.id } });
		expect(owned.length).toBeGreaterThan(0);

		await accounts.deleteAccount(author.id);
		expect(await User.findByPk(author.id)).toBeNull();
		for (const guide of owned) {
			const detail = await guides.getPublishedBySlug(guide.slug);
			expect(detail?.authorName).toBe('Former member');
		}
	});

	it('moves an account to a new address only once the new address confirms, and tells the old one', async () => {
		const email = `mover-${Date.now()}@example.test`;
		const next = `moved-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		const user = await User.findOne({ where: { email } });
		if (!user) throw new Error('user missing');

		expect(
			await accounts.requestEmailChange(
				user.id,
				{ newEmail: next, password: 'wrong long password here' },
				ORIGIN
			)
		).toEqual({ kind: 'wrong_password' });
		expect(
			await accounts.requestEmailChange(user.id, { newEmail: email, password: PASSWORD }, ORIGIN)
		).toEqual({ kind: 'same_address' });
		expect(
			await accounts.requestEmailChange(user.id, { newEmail: next, password: PASSWORD }, ORIGIN)
		).toEqual({ kind: 'ok' });
		await waitForMessage({ to: email, subject: /about to change/i });
		const link = firstLink(
			await waitForMessage({ to: next, subject: /new e-mail/i }),
			'/verify/email'
		);
		// Nothing moves before the confirmation.
		expect((await User.findByPk(user.id))?.email).toBe(email);

		expect(await accounts.confirmEmailChange(tokenFrom(link))).toBe('changed');
		expect((await User.findByPk(user.id))?.email).toBe(next);
		expect(await accounts.authenticate(next, PASSWORD)).not.toBeNull();
		expect(await accounts.confirmEmailChange(tokenFrom(link))).toBe('invalid');
	});

	it('answers a change to a taken address like any other and sends it no link', async () => {
		const a = `first-${Date.now()}@example.test`;
		const b = `second-${Date.now()}@example.test`;
		await signUpAndVerify(a);
		await signUpAndVerify(b);
		const user = await User.findOne({ where: { email: a } });
		if (!user) throw new Error('user missing');
		expect(
			await accounts.requestEmailChange(user.id, { newEmail: b, password: PASSWORD }, ORIGIN)
		).toEqual({ kind: 'ok' });
		await settled();
		expect(await EmailToken.count({ where: { purpose: 'change_email' } })).toBe(0);
		await expect(waitForMessage({ to: b, subject: /new e-mail/i, timeoutMs: 500 })).rejects.toThrow(
			/No e-mail/
		);
	});

	it('a password change cancels outstanding reset and e-mail-change links (issue 12, item 5)', async () => {
		const email = `links-${Date.now()}@example.test`;
		const next = `links-next-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		const user = await User.findOne({ where: { email } });
		if (!user) throw new Error('user missing');

		await accounts.requestPasswordReset(email, ORIGIN);
		const reset = tokenFrom(
			firstLink(await waitForMessage({ to: email, subject: /reset/i }), '/reset/')
		);
		await accounts.requestEmailChange(user.id, { newEmail: next, password: PASSWORD }, ORIGIN);
		const change = tokenFrom(
			firstLink(await waitForMessage({ to: next, subject: /new e-mail/i }), '/verify/email')
		);
		expect(await accounts.isResetTokenUsable(reset)).toBe(true);

		expect(await accounts.changePassword(user.id, PASSWORD, 'brand new long password')).toEqual({
			kind: 'ok'
		});
		expect(await accounts.isResetTokenUsable(reset)).toBe(false);
		expect(await accounts.resetPassword(reset, 'someone else took over')).toBe('invalid');
		expect(await accounts.confirmEmailChange(change)).toBe('invalid');
		expect((await User.findByPk(user.id))?.email).toBe(email);
		expect(await accounts.authenticate(email, 'brand new long password')).not.toBeNull();
	});

	it('answers without waiting for the mail server, even one that never replies (issue 12, item 8)', async () => {
		const email = `hang-${Date.now()}@example.test`;
		await signUpAndVerify(email);
		await settled();
		const user = await User.findOne({ where: { email } });
		if (!user) throw new Error('user missing');
		// A real TCP server that accepts the connection and never sends the SMTP greeting.
		const sockets = new Set<Socket>();
		const hanging = createServer((socket) => sockets.add(socket));
		await new Promise<void>((done) => hanging.listen(0, '127.0.0.1', done));
		const saved = process.env.SMTP_PORT;
		process.env.SMTP_PORT = String((hanging.address() as AddressInfo).port);
		closeTransport();
		try {
			const started = Date.now();
			expect(await accounts.changePassword(user.id, PASSWORD, 'brand new long password')).toEqual({
				kind: 'ok'
			});
			await accounts.requestPasswordReset(email, ORIGIN);
			expect(Date.now() - started).toBeLessThan(2_000);
		} finally {
			for (const socket of sockets) socket.destroy();
			hanging.close();
			process.env.SMTP_PORT = saved;
			await settled();
			closeTransport();
		}
	});

	it('runs the same database statements before answering for known and unknown addresses (issue 12, item 8)', async () => {
		// The database's own statement counters (SHOW GLOBAL STATUS), read around each call
		// while deferred jobs wait (see `deferred` above): only this test talks to this MariaDB.
		const known = `known-${Date.now()}@example.test`;
		await signUpAndVerify(known);
		await drain();

		const resetKnown = await fewestStatements(() => accounts.requestPasswordReset(known, ORIGIN));
		const resetUnknown = await fewestStatements(() =>
			accounts.requestPasswordReset(`unknown-${Date.now()}@example.test`, ORIGIN)
		);
		expect(resetKnown).toEqual(resetUnknown);

		const input = { name: 'Same Work', password: 'other long passphrase here' };
		const signUpExisting = await fewestStatements(() =>
			accounts.signUp({ ...input, email: known }, ORIGIN)
		);
		const signUpNew = await fewestStatements(() =>
			accounts.signUp(
				{ ...input, email: `fresh-${Date.now()}-${Math.random()}@example.test` },
				ORIGIN
			)
		);
		expect(signUpExisting).toEqual(signUpNew);
	});

	it('hashes the password on sign-up whether or not the address has an account (issue 12, item 8)', async () => {
		// An argon2id hash (m = 19 MiB, t = 2) is most of a sign-up's work; if only new addresses
		// paid for it, the answer time would tell which addresses have accounts. Measured as
		// this process's CPU time (argon2 runs on libuv's threads, which count too), so a slow
		// mail server or a busy machine does not blur it. Medians of runs taken in turns, with
		// a generous bound (common practice, no published source).
		const known = `timed-${Date.now()}@example.test`;
		await signUpAndVerify(known);
		const input = { name: 'Timed', password: 'other long passphrase here' };
		const existing: number[] = [];
		const fresh: number[] = [];
		for (let i = 0; i < 5; i++) {
			await drain();
			existing.push(await cpuTime(() => accounts.signUp({ ...input, email: known }, ORIGIN)));
			await drain();
			fresh.push(
				await cpuTime(() =>
					accounts.signUp({ ...input, email: `timed-new-${i}-${Date.now()}@example.test` }, ORIGIN)
				)
			);
		}
		await drain();
		const ratio = median(existing) / median(fresh);
		expect(
			ratio,
			`CPU ms: existing ${existing.map(Math.round).join(', ')}; new ${fresh.map(Math.round).join(', ')}`
		).toBeGreaterThan(0.5);
		expect(ratio).toBeLessThan(2);
	});
});

const COUNTED = ['Com_select', 'Com_insert', 'Com_update', 'Com_delete', 'Com_begin', 'Com_commit'];

async function statementCounters(): Promise<Record<string, number>> {
	const rows = await sequelize.query<{ Variable_name: string; Value: string }>(
		`SHOW GLOBAL STATUS WHERE Variable_name IN (${COUNTED.map(() => '?').join(', ')})`,
		{ replacements: COUNTED, type: QueryTypes.SELECT }
	);
	return Object.fromEntries(rows.map((r) => [r.Variable_name, Number(r.Value)]));
}

/*
 * SHOW GLOBAL STATUS counts every client of the server, so anything else that reaches it
 * while a call runs (another checkout's tools, a developer's session) can only add to a
 * reading, never take away. The fewest statements over three readings of the same call is
 * what the call itself ran.
 */
async function fewestStatements(
	work: () => Promise<unknown>,
	readings = 3
): Promise<Record<string, number>> {
	let fewest: Record<string, number> | null = null;
	for (let i = 0; i < readings; i++) {
		const counted = await statementsDuring(work);
		fewest = fewest
			? Object.fromEntries(COUNTED.map((n) => [n, Math.min(fewest![n] ?? 0, counted[n] ?? 0)]))
			: counted;
	}
	return fewest ?? {};
}

async function statementsDuring(work: () => Promise<unknown>): Promise<Record<string, number>> {
	const before = await statementCounters();
	deferred.held = true;
	try {
		await work();
	} finally {
		deferred.held = false;
	}
	const after = await statementCounters();
	release();
	await drain();
	return Object.fromEntries(
		COUNTED.map((name) => [name, (after[name] ?? 0) - (before[name] ?? 0)])
	);
}

/** Milliseconds of CPU (user + system, every thread of this process) spent during `work`. */
async function cpuTime(work: () => Promise<unknown>): Promise<number> {
	const started = process.cpuUsage();
	await work();
	const spent = process.cpuUsage(started);
	return (spent.user + spent.system) / 1000;
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	return sorted[Math.floor(sorted.length / 2)] ?? 0;
}

/** Waits for work the services left running after answering (mail, account rows). */
const drain = settled;
