/*
 * The mail worker: claims queued jobs, sends them through nodemailer's pooled SMTP
 * transport and records each server answer. It runs inside the app (`npm start`, see
 * src/hooks.server.ts) and as its own process (`npm run worker`, scripts/worker.ts); any
 * number may run against one MariaDB. Relative imports and plain process.env only.
 *
 * Exactly once, step by step (docs/architecture.md "Mail queue"):
 * 1. Claim: in one short transaction, SELECT … FOR UPDATE SKIP LOCKED picks due `queued`
 *    rows no other worker holds, and UPDATE marks them `sending` with this claim's attempt
 *    id and a lease. The claim commits BEFORE any SMTP traffic, so from here on the database
 *    says "this job may be on the wire".
 * 2. Send: the message carries the job's fixed Message-ID. No send starts closer than
 *    `sendGuardMs` to the lease's end, so a live worker never holds a job past its lease.
 * 3. Record: the moment the server answers 250, one UPDATE … WHERE id AND attempt_id marks
 *    the job `sent`. A 5xx marks it `failed` and suppresses the subscriber; a 4xx or a
 *    connection that never opened puts it back to `queued` with back-off.
 * 4. The window: a worker that dies between the server taking the message and step 3
 *    leaves a `sending` row for a delivered message; one that dies before the server took
 *    it leaves the same row for an undelivered one. Nothing in SMTP tells them apart, so
 *    when the lease has run out, recovery claims the row afresh and asks the delivery check
 *    (delivery-check.ts) by Message-ID: delivered → `sent`, absent → sent now, no check
 *    configured → `in_doubt` (never resent automatically). The same holds for a live error
 *    with no server answer after the connection was up.
 * tests/integration/mail-queue-crash.spec.ts kills a real worker process mid-mailing and
 * counts every recipient's messages at the SMTP fake.
 */
import { createTransport, type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { BackgroundLoop } from '../../jobs/background-loop.js';
import { claimWithLease } from '../../jobs/lease-claim.js';
import { classifySmtpError, mayRetry, retryDelayMs } from '../../../domain/mail-delivery.js';
import { prepareMessage } from '../index.js';
import { mailConfigFromEnv, transportOptions, type MailConfig } from '../transport.js';
import { compose, MailingContentCache } from './compose.js';
import type { DeliveryCheck } from './delivery-check.js';
import { JobLedger, type Claimed, type JobRow, type WorkerLog } from './job-ledger.js';
import type { QueueSettings } from './settings.js';

export type { WorkerLog } from './job-ledger.js';

export interface MailWorkerOptions {
	sequelize: Sequelize;
	settings: QueueSettings;
	check: DeliveryCheck | null;
	config?: MailConfig;
	transporter?: Transporter<SMTPTransport.SentMessageInfo>;
	log?: WorkerLog;
}

export interface RoundResult {
	claimed: number;
	recovered: number;
}

const JOB_COLUMNS = `id, kind, mailing_id AS mailingId, subscriber_id AS subscriberId,
	to_email AS toEmail, payload, message_id AS messageId, attempts`;

function defaultLog(event: string, detail: Record<string, unknown> = {}): void {
	if (process.env.LOG_LEVEL === 'silent') return;
	console.log(
		JSON.stringify({ t: new Date().toISOString(), kind: 'mail_worker', event, ...detail })
	);
}

function codeOf(response: string | undefined): number | null {
	const code = Number(/^(\d{3})/.exec(response ?? '')?.[1]);
	return Number.isInteger(code) ? code : null;
}

function errorFields(error: unknown) {
	return typeof error === 'object' && error !== null
		? (error as { responseCode?: number; code?: string; originalCode?: string; message?: string })
		: { message: String(error) };
}

export function createPooledTransport(
	config: MailConfig,
	connections: number
): Transporter<SMTPTransport.SentMessageInfo> {
	return createTransport({
		...transportOptions(config),
		pool: true,
		maxConnections: connections,
		maxMessages: 500
	} as SMTPTransport.Options);
}

export class MailWorker {
	private readonly sequelize: Sequelize;
	private readonly settings: QueueSettings;
	private readonly check: DeliveryCheck | null;
	private readonly config: MailConfig;
	private readonly transporter: Transporter<SMTPTransport.SentMessageInfo>;
	private readonly ownsTransporter: boolean;
	private readonly log: WorkerLog;
	private readonly contents = new MailingContentCache();
	private readonly jobs: JobLedger;
	private readonly background: BackgroundLoop;

	constructor(options: MailWorkerOptions) {
		this.sequelize = options.sequelize;
		this.settings = options.settings;
		this.check = options.check;
		this.config = options.config ?? mailConfigFromEnv();
		this.ownsTransporter = !options.transporter;
		this.transporter =
			options.transporter ?? createPooledTransport(this.config, options.settings.concurrency);
		this.log = options.log ?? defaultLog;
		this.jobs = new JobLedger(this.sequelize, this.settings.retry, this.log);
		this.background = new BackgroundLoop(
			async () => {
				const round = await this.runOnce();
				return round.claimed + round.recovered > 0;
			},
			this.settings.idleMs,
			(error) => this.log('round_failed', { error: String(error) })
		);
	}

	/** Set by stop(): claim nothing more, start no more sends. */
	private get stopping(): boolean {
		return this.background.stopped;
	}

	/** One round: settle expired leases, then claim and send one batch. */
	async runOnce(): Promise<RoundResult> {
		const touched = new Set<number>();
		const recovered = await this.recover(touched);
		const jobs = await this.claim();
		const statuses = await this.subscriberStatuses(jobs);
		await this.inLanes(jobs, (job) => this.process(job, touched, false, statuses));
		for (const mailingId of touched) await this.jobs.finishMailing(mailingId);
		return { claimed: jobs.length, recovered };
	}

	/** Runs rounds in the background until stop(). */
	start(): void {
		if (this.background.start()) this.log('started', { concurrency: this.settings.concurrency });
	}

	/** Ends the background loop after the jobs in hand; unstarted ones go back to the queue. */
	async stop(): Promise<void> {
		await this.background.stop();
		if (this.ownsTransporter) this.transporter.close();
		this.log('stopped');
	}

	/** Wakes a sleeping loop (the app calls it after queueing mail). */
	poke(): void {
		this.background.poke();
	}

	/**
	 * For tests and the bench: rounds until no job is due or waiting for its lease, then
	 * resolves; throws after timeoutMs. Jobs waiting out a back-off count as pending.
	 */
	async drain(timeoutMs = 30_000): Promise<void> {
		const until = Date.now() + timeoutMs;
		for (;;) {
			const round = await this.runOnce();
			if (round.claimed + round.recovered > 0) continue;
			const [row] = await this.sequelize.query<{ n: number }>(
				"SELECT COUNT(*) AS n FROM mail_jobs WHERE status IN ('queued', 'sending')",
				{ type: QueryTypes.SELECT }
			);
			if (Number(row?.n ?? 0) === 0) return;
			if (Date.now() > until) throw new Error('mail queue did not drain in time');
			await new Promise((r) => setTimeout(r, 25));
		}
	}

	private async inLanes<T>(items: T[], work: (item: T) => Promise<void>): Promise<void> {
		let next = 0;
		const lane = async () => {
			while (next < items.length) {
				const item = items[next++] as T;
				await work(item);
			}
		};
		await Promise.all(
			Array.from({ length: Math.min(this.settings.concurrency, items.length) }, lane)
		);
	}

	/** Step 1: claim due jobs and commit `sending` + lease + attempt id before any SMTP. */
	private async claim(): Promise<Claimed[]> {
		if (this.stopping) return [];
		const { attemptId, claimedAt, rows } = await claimWithLease(
			this.sequelize,
			{
				table: 'mail_jobs',
				due: "status = 'queued' AND next_attempt_at <= UTC_TIMESTAMP(3)",
				order: 'next_attempt_at, id',
				limit: this.settings.batchSize,
				leaseMs: this.settings.leaseMs,
				set: "status = 'sending', attempts = attempts + 1"
			},
			(ids, transaction) => this.readJobs(ids, transaction)
		);
		const startBy = claimedAt + this.settings.leaseMs - this.settings.sendGuardMs;
		return rows.map((r) => ({ ...r, id: Number(r.id), attemptId, startBy }));
	}

	private readJobs(ids: number[], transaction: Transaction): Promise<JobRow[]> {
		return this.sequelize.query<JobRow>(
			`SELECT ${JOB_COLUMNS} FROM mail_jobs WHERE id IN (:ids) ORDER BY id`,
			{ type: QueryTypes.SELECT, transaction, replacements: { ids } }
		);
	}

	/**
	 * Step 4: `sending` rows whose lease ran out belong to a worker that stopped (or to a
	 * live error with no answer). Claim them afresh, then ask the delivery check.
	 */
	private async recover(touched: Set<number>): Promise<number> {
		if (this.stopping) return 0;
		const { attemptId, claimedAt, rows } = await claimWithLease(
			this.sequelize,
			{
				table: 'mail_jobs',
				due: "status = 'sending' AND lease_until < UTC_TIMESTAMP(3)",
				order: 'lease_until, id',
				limit: this.settings.batchSize,
				leaseMs: this.settings.leaseMs
			},
			(ids, transaction) => this.readJobs(ids, transaction)
		);
		if (rows.length === 0) return 0;
		const startBy = claimedAt + this.settings.leaseMs - this.settings.sendGuardMs;
		const jobs: Claimed[] = rows.map((r) => ({ ...r, id: Number(r.id), attemptId, startBy }));
		await this.inLanes(jobs, async (job) => {
			if (job.mailingId !== null) touched.add(job.mailingId);
			if (!this.check) {
				await this.jobs.settle(job, 'in_doubt', {
					error:
						'The worker stopped while sending; delivery could not be checked, so it is not resent.'
				});
				this.log('in_doubt', { job: job.id });
				return;
			}
			let answer: 'delivered' | 'absent';
			try {
				answer = await this.check(job.messageId);
			} catch (error) {
				// Ask again later; the job stays `sending` under a new lease.
				await this.jobs.hold(
					job,
					retryDelayMs(1, this.settings.retry),
					`delivery check failed: ${String(error)}`
				);
				return;
			}
			if (answer === 'delivered') {
				await this.jobs.settle(job, 'sent', {
					sentNow: true,
					error: 'Delivered before the worker stopped (checked by Message-ID).'
				});
				this.log('recovered_delivered', { job: job.id });
			} else {
				this.log('recovered_resend', { job: job.id });
				await this.process({ ...job, attempts: job.attempts + 1 }, touched, true);
			}
		});
		return jobs.length;
	}

	/** Each mailing recipient's current status, in one query for the whole batch. */
	private async subscriberStatuses(jobs: Claimed[]): Promise<Map<number, string>> {
		const ids = [
			...new Set(
				jobs.flatMap((j) =>
					j.kind === 'mailing' && j.subscriberId !== null ? [j.subscriberId] : []
				)
			)
		];
		if (ids.length === 0) return new Map();
		const rows = await this.sequelize.query<{ id: number; status: string }>(
			'SELECT id, status FROM subscribers WHERE id IN (:ids)',
			{ type: QueryTypes.SELECT, replacements: { ids } }
		);
		return new Map(rows.map((r) => [Number(r.id), r.status]));
	}

	/** Steps 2 and 3 for one claimed job. */
	private async process(
		job: Claimed,
		touched: Set<number>,
		recovering = false,
		statuses?: Map<number, string>
	): Promise<void> {
		if (job.mailingId !== null) touched.add(job.mailingId);
		if (this.stopping || Date.now() > job.startBy) {
			await this.jobs.release(job);
			return;
		}
		if (job.subscriberId !== null && job.kind === 'mailing') {
			const status =
				statuses?.get(job.subscriberId) ??
				(await this.subscriberStatuses([job])).get(job.subscriberId);
			if (status !== 'confirmed') {
				await this.jobs.settle(job, 'skipped', {
					error: 'The recipient left the list before their turn.'
				});
				return;
			}
		}
		let options;
		try {
			const composed = await compose(job, this.contents);
			options = prepareMessage(this.config.from, job.toEmail, composed.message, {
				headers: composed.headers,
				messageId: job.messageId
			});
		} catch (error) {
			await this.jobs.settle(job, 'failed', {
				error: `Could not build the message: ${String(error)}`
			});
			this.log('compose_failed', { job: job.id, error: String(error) });
			return;
		}
		if (recovering) await this.jobs.bumpAttempts(job);
		try {
			const info = await this.transporter.sendMail(options);
			await this.jobs.settle(job, 'sent', { sentNow: true, code: codeOf(info.response) });
		} catch (error) {
			const failure = classifySmtpError(errorFields(error));
			if (failure.kind === 'permanent') {
				await this.jobs.settle(job, 'failed', { code: failure.code, error: failure.reason });
				if (job.subscriberId !== null) await this.jobs.suppress(job.subscriberId, failure.reason);
				this.log('failed_permanent', { job: job.id, code: failure.code });
			} else if (failure.kind === 'temporary') {
				if (mayRetry(job.attempts, this.settings.retry)) {
					await this.jobs.retryLater(job, failure.code, failure.reason);
				} else {
					await this.jobs.settle(job, 'failed', {
						code: failure.code,
						error: `Gave up after ${job.attempts} attempts: ${failure.reason}`
					});
				}
				this.log('failed_temporary', { job: job.id, code: failure.code, attempts: job.attempts });
			} else {
				// The connection was up and broke without an answer: maybe delivered. Recovery
				// checks by Message-ID once this hold ends, instead of resending blindly.
				await this.jobs.hold(job, retryDelayMs(job.attempts, this.settings.retry), failure.reason);
				this.log('failed_unknown', { job: job.id, attempts: job.attempts });
			}
		}
	}
}
