/*
 * Putting mail on the queue (mail_jobs). Relative imports only: services call this inside
 * their own transactions, so a message is queued exactly when the change it reports
 * commits, and the request never waits for SMTP.
 *
 * kind 'message' keeps the whole rendered message in the payload: any transactional mail
 * (confirmations, notices, later receipts or digests) fits. kind 'mailing' keeps only one
 * recipient's values; the worker renders the mailing itself (compose.ts).
 */
import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { MailJob } from '../../db/models/index.js';
import { prepareMessage, type MailTemplate } from '../index.js';
import { mailConfigFromEnv } from '../transport.js';

/** The domain of MAIL_FROM's address, for Message-IDs (`<…@slotwise.test>`). */
export function messageIdDomain(from: string = mailConfigFromEnv().from): string {
	const match = /@([A-Za-z0-9.-]+)>?\s*$/.exec(from);
	return match?.[1]?.toLowerCase() ?? 'slotwise.invalid';
}

/** Fixed per mailing and recipient, so every attempt carries the same Message-ID. */
export function mailingMessageId(mailingId: number, subscriberId: number, domain: string): string {
	return `<mailing.${mailingId}.${subscriberId}@${domain}>`;
}

export interface MessageJobPayload {
	subject: string;
	text: string;
	html: string;
	headers?: Record<string, string>;
}

export interface EnqueueMessage {
	to: string;
	message: MailTemplate;
	headers?: Record<string, string>;
	/** Set for mail about a newsletter subscription: a permanent refusal suppresses it. */
	subscriberId?: number | null;
	/**
	 * A stable name for this message ("notice.123"): queueing the same key twice queues it
	 * once. Without one each call queues a new message.
	 */
	key?: string;
}

/**
 * Queues one message to one recipient. The address and extra headers are checked now, with
 * the same rules as an immediate send (MailAddressError, MailHeaderError), so a bad one
 * fails the caller rather than the worker.
 */
export async function enqueueMessage(
	input: EnqueueMessage,
	transaction?: Transaction
): Promise<{ id: number; messageId: string }> {
	const from = mailConfigFromEnv().from;
	const prepared = prepareMessage(from, input.to, input.message, { headers: input.headers });
	const local = input.key
		? `msg.${input.key.replace(/[^A-Za-z0-9.-]/g, '-')}`
		: `msg.${randomUUID()}`;
	const messageId = `<${local}@${messageIdDomain(from)}>`;
	const payload: MessageJobPayload = {
		subject: prepared.subject,
		text: prepared.text,
		html: prepared.html,
		...(prepared.headers ? { headers: prepared.headers } : {})
	};
	if (input.key) {
		const existing = await MailJob.findOne({ where: { messageId }, transaction });
		if (existing) return { id: existing.id, messageId };
	}
	const job = await MailJob.create(
		{
			kind: 'message',
			toEmail: prepared.to.address,
			subscriberId: input.subscriberId ?? null,
			payload: payload as unknown as Record<string, unknown>,
			messageId,
			nextAttemptAt: new Date()
		},
		{ transaction }
	);
	return { id: job.id, messageId };
}

/** One recipient of a mailing, with the values only their copy has. */
export interface MailingRecipientJob {
	subscriberId: number;
	to: string;
	payload: Record<string, unknown>;
}

const CHUNK = 1000;

/**
 * Queues a mailing's recipients, one job each. The unique (mailing, subscriber) index makes
 * this idempotent: a recipient already queued is left as it is.
 */
export async function enqueueMailingJobs(
	mailingId: number,
	recipients: readonly MailingRecipientJob[],
	transaction?: Transaction
): Promise<void> {
	const domain = messageIdDomain();
	const now = new Date();
	for (let i = 0; i < recipients.length; i += CHUNK) {
		await MailJob.bulkCreate(
			recipients.slice(i, i + CHUNK).map((r) => ({
				kind: 'mailing' as const,
				mailingId,
				subscriberId: r.subscriberId,
				toEmail: r.to,
				payload: r.payload,
				messageId: mailingMessageId(mailingId, r.subscriberId, domain),
				nextAttemptAt: now
			})),
			{ transaction, ignoreDuplicates: true }
		);
	}
}
