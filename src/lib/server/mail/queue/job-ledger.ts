/*
 * The mail queue's writes to a claimed job and what follows from them (docs/architecture.md
 * "Mail queue"): every UPDATE names the job AND this claim's attempt id, so a worker whose
 * lease ran out can no longer change a job another worker has since claimed. The worker
 * (worker.ts) decides; this records.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { retryDelayMs } from '../../../domain/mail-delivery.js';
import type { QueueSettings } from './settings.js';

export interface WorkerLog {
	(event: string, detail?: Record<string, unknown>): void;
}

export interface JobRow {
	id: number;
	kind: string;
	mailingId: number | null;
	subscriberId: number | null;
	toEmail: string;
	payload: unknown;
	messageId: string;
	attempts: number;
}

export interface Claimed extends JobRow {
	attemptId: string;
	/** Local clock: no send may start after this (lease end minus the send guard). */
	startBy: number;
}

export class JobLedger {
	constructor(
		private readonly sequelize: Sequelize,
		private readonly retry: QueueSettings['retry'],
		private readonly log: WorkerLog
	) {}

	async bumpAttempts(job: Claimed): Promise<void> {
		await this.sequelize.query(
			'UPDATE mail_jobs SET attempts = attempts + 1 WHERE id = :id AND attempt_id = :attemptId',
			{ type: QueryTypes.UPDATE, replacements: { id: job.id, attemptId: job.attemptId } }
		);
	}

	/** A final state for the job, written only while this claim still holds it. */
	async settle(
		job: Claimed,
		status: 'sent' | 'failed' | 'skipped' | 'in_doubt',
		extra: { code?: number | null; error?: string; sentNow?: boolean } = {}
	): Promise<void> {
		const [, affected] = await this.sequelize.query(
			`UPDATE mail_jobs SET status = :status, smtp_code = :code, last_error = :error,
			 sent_at = ${extra.sentNow ? 'UTC_TIMESTAMP(3)' : 'sent_at'}, lease_until = NULL,
			 updated_at = UTC_TIMESTAMP(3)
			 WHERE id = :id AND attempt_id = :attemptId AND status = 'sending'`,
			{
				type: QueryTypes.UPDATE,
				replacements: {
					status,
					code: extra.code ?? null,
					error: extra.error?.slice(0, 300) ?? null,
					id: job.id,
					attemptId: job.attemptId
				}
			}
		);
		if (affected !== 1) this.log('lease_lost', { job: job.id, status });
	}

	/** Temporary failure: back to the queue after the back-off. */
	async retryLater(job: Claimed, code: number | null, error: string): Promise<void> {
		await this.sequelize.query(
			`UPDATE mail_jobs SET status = 'queued', smtp_code = :code, last_error = :error,
			 next_attempt_at = UTC_TIMESTAMP(3) + INTERVAL :delayUs MICROSECOND,
			 lease_until = NULL, attempt_id = NULL, updated_at = UTC_TIMESTAMP(3)
			 WHERE id = :id AND attempt_id = :attemptId AND status = 'sending'`,
			{
				type: QueryTypes.UPDATE,
				replacements: {
					code,
					error: error.slice(0, 300),
					delayUs: retryDelayMs(job.attempts, this.retry) * 1000,
					id: job.id,
					attemptId: job.attemptId
				}
			}
		);
	}

	/** Outcome unknown: keep it `sending` until the hold ends; recovery then checks it. */
	async hold(job: Claimed, delayMs: number, error: string): Promise<void> {
		await this.sequelize.query(
			`UPDATE mail_jobs SET last_error = :error,
			 lease_until = UTC_TIMESTAMP(3) + INTERVAL :delayUs MICROSECOND, updated_at = UTC_TIMESTAMP(3)
			 WHERE id = :id AND attempt_id = :attemptId AND status = 'sending'`,
			{
				type: QueryTypes.UPDATE,
				replacements: {
					error: error.slice(0, 300),
					delayUs: delayMs * 1000,
					id: job.id,
					attemptId: job.attemptId
				}
			}
		);
	}

	/** Not started (stopping, or too close to the lease's end): back to the queue as it was. */
	async release(job: Claimed): Promise<void> {
		await this.sequelize.query(
			`UPDATE mail_jobs SET status = 'queued', attempts = GREATEST(attempts - 1, 0),
			 lease_until = NULL, attempt_id = NULL, updated_at = UTC_TIMESTAMP(3)
			 WHERE id = :id AND attempt_id = :attemptId AND status = 'sending'`,
			{ type: QueryTypes.UPDATE, replacements: { id: job.id, attemptId: job.attemptId } }
		);
	}

	/** A permanent refusal: no more newsletter mail to this address until it confirms again. */
	async suppress(subscriberId: number, reason: string): Promise<void> {
		await this.sequelize.query(
			`UPDATE subscribers SET status = 'suppressed', suppressed_at = UTC_TIMESTAMP(),
			 suppressed_reason = :reason, updated_at = UTC_TIMESTAMP()
			 WHERE id = :id AND status IN ('pending', 'confirmed')`,
			{ type: QueryTypes.UPDATE, replacements: { id: subscriberId, reason: reason.slice(0, 200) } }
		);
	}

	/** When no job of the mailing is left queued or sending, it is finished, with its counts. */
	async finishMailing(mailingId: number): Promise<void> {
		const counts = await this.sequelize.query<{ status: string; n: number }>(
			'SELECT status, COUNT(*) AS n FROM mail_jobs WHERE mailing_id = :id GROUP BY status',
			{ type: QueryTypes.SELECT, replacements: { id: mailingId } }
		);
		const count = (s: string) => Number(counts.find((c) => c.status === s)?.n ?? 0);
		if (count('queued') + count('sending') > 0) return;
		const summary = {
			sent: count('sent'),
			failed: count('failed'),
			skipped: count('skipped'),
			inDoubt: count('in_doubt')
		};
		const [, affected] = await this.sequelize.query(
			`UPDATE mailings SET status = 'finished', finished_at = UTC_TIMESTAMP(), summary = :summary,
			 updated_at = UTC_TIMESTAMP() WHERE id = :id AND status = 'sending'`,
			{
				type: QueryTypes.UPDATE,
				replacements: { id: mailingId, summary: JSON.stringify(summary) }
			}
		);
		if (affected === 1) this.log('mailing_finished', { mailing: mailingId, ...summary });
	}
}
