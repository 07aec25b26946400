import { createTransport } from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { MailJob, Region, Subscriber, sequelize } from '../../src/lib/server/db';
import { mailConfigFromEnv, templates } from '../../src/lib/server/mail';
import { MailAddressError } from '../../src/lib/server/mail';
import {
	MailWorker,
	enqueueMessage,
	httpDeliveryCheck,
	type QueueSettings
} from '../../src/lib/server/mail/queue';
import { resetDatabase } from '../support/db';
import { freePort, startFakeSmtp, type FakeSmtp } from '../support/smtp-fake-process';

/*
 * The mail queue (src/lib/server/mail/queue) against a private SMTP fake in its own
 * process: real SMTP, real MariaDB, counts taken at the server. Back-off and leases are
 * shortened so retries happen within the test.
 */

const SETTINGS: QueueSettings = {
	batchSize: 20,
	concurrency: 3,
	leaseMs: 1_500,
	sendGuardMs: 500,
	idleMs: 20,
	retry: { baseMs: 50, maxMs: 200, maxAttempts: 3 }
};

let fake: FakeSmtp;
const workers: MailWorker[] = [];

function worker(
	overrides: Partial<{ port: number; check: boolean; settings: Partial<QueueSettings> }> = {}
) {
	const w = new MailWorker({
		sequelize,
		settings: { ...SETTINGS, ...overrides.settings },
		check: overrides.check === false ? null : httpDeliveryCheck(fake.mailboxUrl),
		config: { ...mailConfigFromEnv(), host: '127.0.0.1', port: overrides.port ?? fake.smtpPort },
		log: () => {}
	});
	workers.push(w);
	return w;
}

const note = (n: number) =>
	templates.passwordChanged({ resetUrl: `https://slotwise.test/reset?n=${n}` });

beforeAll(async () => {
	fake = await startFakeSmtp();
});

afterAll(async () => {
	for (const w of workers) await w.stop();
	await fake.stop();
});

beforeEach(async () => {
	await resetDatabase();
	await fake.clear();
});

async function newSubscriber(email: string): Promise<Subscriber> {
	const region =
		(await Region.findOne({ where: { code: 'us' } })) ??
		(await Region.create({
			code: 'us',
			name: 'United States',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0,
			categoryFactorsBp: {}
		}));
	return Subscriber.create({ email, homeRegionId: region.id, status: 'confirmed' });
}

describe('the mail queue', () => {
	it('sends a queued message once, with its fixed Message-ID, and records the 250', async () => {
		const queued = await enqueueMessage({ to: 'ana@example.test', message: note(1) });
		expect(await fake.counts()).toEqual({ total: 0, recipients: {} });
		await worker().drain();
		expect(await fake.counts()).toEqual({ total: 1, recipients: { 'ana@example.test': 1 } });
		expect(await fake.deliveries(queued.messageId)).toBe(1);
		const job = (await MailJob.findByPk(queued.id))!;
		expect(job.status).toBe('sent');
		expect(job.smtpCode).toBe(250);
		expect(job.attempts).toBe(1);
		expect(job.sentAt).not.toBeNull();
	});

	it('refuses a header-injecting address when queueing, before anything is stored', async () => {
		await expect(
			enqueueMessage({ to: 'a@example.test\r\nBcc: b@example.test', message: note(2) })
		).rejects.toBeInstanceOf(MailAddressError);
		expect(await MailJob.count()).toBe(0);
	});

	it('queues a keyed message once however often it is queued', async () => {
		const a = await enqueueMessage({ to: 'key@example.test', message: note(3), key: 'notice.7' });
		const b = await enqueueMessage({ to: 'key@example.test', message: note(3), key: 'notice.7' });
		expect(b.id).toBe(a.id);
		await worker().drain();
		expect((await fake.counts()).total).toBe(1);
	});

	it('fails a permanent refusal (550) at once and suppresses the subscriber', async () => {
		// RFC 5321 §4.2.1 (docs/sources.md 12b): 5yz is a permanent negative completion.
		await fake.setRules([{ localPart: 'gone', code: 550 }]);
		const sub = await newSubscriber('gone.one@example.test');
		const queued = await enqueueMessage({
			to: sub.email,
			message: note(4),
			subscriberId: sub.id
		});
		await worker().drain();
		const job = (await MailJob.findByPk(queued.id))!;
		expect(job.status).toBe('failed');
		expect(job.smtpCode).toBe(550);
		expect(job.attempts).toBe(1);
		expect((await fake.counts()).total).toBe(0);
		await sub.reload();
		expect(sub.status).toBe('suppressed');
		expect(sub.suppressedReason).toMatch(/550/);
	});

	it('retries a temporary refusal (451) with back-off and delivers once it passes', async () => {
		// RFC 5321 §4.2.1 (docs/sources.md 12b): 4yz is transient; the client should try again.
		await fake.setRules([{ localPart: 'busy', code: 451, times: 2 }]);
		const sub = await newSubscriber('busy.one@example.test');
		const queued = await enqueueMessage({ to: sub.email, message: note(5), subscriberId: sub.id });
		await worker().drain();
		const job = (await MailJob.findByPk(queued.id))!;
		expect(job.status).toBe('sent');
		expect(job.attempts).toBe(3);
		expect(await fake.counts()).toEqual({ total: 1, recipients: { 'busy.one@example.test': 1 } });
		await sub.reload();
		expect(sub.status).toBe('confirmed');
	});

	it('gives up after the last attempt of a temporary refusal, without suppressing', async () => {
		await fake.setRules([{ localPart: 'always-busy', code: 421 }]);
		const sub = await newSubscriber('always-busy@example.test');
		const queued = await enqueueMessage({ to: sub.email, message: note(6), subscriberId: sub.id });
		await worker().drain();
		const job = (await MailJob.findByPk(queued.id))!;
		expect(job.status).toBe('failed');
		expect(job.attempts).toBe(3);
		expect(job.lastError).toMatch(/^Gave up after 3 attempts/);
		await sub.reload();
		expect(sub.status).toBe('confirmed');
	});

	it('puts a job back with back-off when the server cannot be reached at all', async () => {
		const closed = await freePort();
		const queued = await enqueueMessage({ to: 'nobody-home@example.test', message: note(7) });
		const round = await worker({ port: closed }).runOnce();
		expect(round.claimed).toBe(1);
		const job = (await MailJob.findByPk(queued.id))!;
		expect(job.status).toBe('queued');
		expect(job.attempts).toBe(1);
		expect(job.lastError).toMatch(/ECONNREFUSED/);
		// Then the server is there again: the next attempt delivers it.
		await worker().drain();
		expect((await fake.counts()).recipients['nobody-home@example.test']).toBe(1);
	});

	it('two workers draining one queue at once send every message exactly once', async () => {
		for (let i = 0; i < 120; i++)
			await enqueueMessage({ to: `pair${i}@example.test`, message: note(i) });
		await Promise.all([worker().drain(), worker().drain()]);
		const counts = await fake.counts();
		expect(counts.total).toBe(120);
		expect(Object.values(counts.recipients).every((n) => n === 1)).toBe(true);
		expect(await MailJob.count({ where: { status: 'sent' } })).toBe(120);
	});
});

describe('a job left "sending" by a worker that stopped', () => {
	/** The state a killed worker leaves: claimed, leased (already expired), maybe delivered. */
	async function strand(to: string, delivered: boolean) {
		const queued = await enqueueMessage({ to, message: note(9) });
		await MailJob.update(
			{
				status: 'sending',
				attempts: 1,
				attemptId: '00000000-0000-0000-0000-000000000001',
				leaseUntil: new Date(Date.now() - 1_000)
			},
			{ where: { id: queued.id } }
		);
		if (delivered) {
			// The dead worker's send that the server took: same Message-ID, before the crash.
			const direct = createTransport({ host: '127.0.0.1', port: fake.smtpPort, secure: false });
			await direct.sendMail({
				from: 'Slotwise <no-reply@slotwise.test>',
				to,
				subject: 'sent before the crash',
				text: 'x',
				messageId: queued.messageId
			});
			direct.close();
		}
		return queued.id;
	}

	it('is recorded as sent, not sent again, when the delivery check finds it', async () => {
		const id = await strand('was-delivered@example.test', true);
		await worker().drain();
		expect((await fake.counts()).recipients['was-delivered@example.test']).toBe(1);
		const job = (await MailJob.findByPk(id))!;
		expect(job.status).toBe('sent');
		expect(job.lastError).toMatch(/Delivered before the worker stopped/);
	});

	it('is sent once when the delivery check does not find it', async () => {
		const id = await strand('never-arrived@example.test', false);
		await worker().drain();
		expect((await fake.counts()).recipients['never-arrived@example.test']).toBe(1);
		const job = (await MailJob.findByPk(id))!;
		expect(job.status).toBe('sent');
		expect(job.attempts).toBe(2);
	});

	it('becomes in_doubt and is never resent when no delivery check is configured', async () => {
		const a = await strand('doubt-a@example.test', true);
		const b = await strand('doubt-b@example.test', false);
		await worker({ check: false }).drain();
		const counts = await fake.counts();
		expect(counts.recipients['doubt-a@example.test']).toBe(1);
		expect(counts.recipients['doubt-b@example.test']).toBeUndefined();
		expect((await MailJob.findByPk(a))!.status).toBe('in_doubt');
		expect((await MailJob.findByPk(b))!.status).toBe('in_doubt');
	});

	it('a live lease is left alone: another worker does not touch it', async () => {
		const queued = await enqueueMessage({ to: 'still-leased@example.test', message: note(10) });
		await MailJob.update(
			{
				status: 'sending',
				attempts: 1,
				attemptId: 'x'.repeat(36),
				leaseUntil: new Date(Date.now() + 60_000)
			},
			{ where: { id: queued.id } }
		);
		const round = await worker().runOnce();
		expect(round).toEqual({ claimed: 0, recovered: 0 });
		expect((await MailJob.findByPk(queued.id))!.status).toBe('sending');
		expect((await fake.counts()).total).toBe(0);
	});
});
