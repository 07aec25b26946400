/*
 * What an SMTP answer means for a queued message, and when to try again. Pure: the mail
 * queue (src/lib/server/mail/queue) feeds it nodemailer's error fields.
 *
 * RFC 5321 §4.2.1 (docs/sources.md 12b): a 4yz reply is a transient negative completion —
 * the action did not occur and may be requested again; a 5yz reply is a permanent negative
 * completion — the same request will fail again. Either way the server has answered, so we
 * know the message was NOT accepted.
 *
 * Without a reply the answer depends on when the connection failed. If it never opened
 * (refused, unreachable, no DNS answer), nothing can have been delivered. If it failed
 * later, the server may have received the whole message and accepted it just before the
 * line went dead, so the outcome is unknown and the queue must check before sending again.
 */

export type SmtpFailure =
	| { kind: 'permanent'; code: number | null; reason: string }
	| { kind: 'temporary'; code: number | null; reason: string }
	| { kind: 'unknown'; code: null; reason: string };

/** The fields of a nodemailer error the decision reads. */
export interface SmtpErrorFields {
	responseCode?: number | false;
	code?: string;
	/** The system error under nodemailer's own code, e.g. ECONNREFUSED under ESOCKET. */
	originalCode?: string;
	message?: string;
}

// The connection was never established: no byte of any message reached a server.
const NEVER_CONNECTED = new Set([
	'ECONNREFUSED',
	'EHOSTUNREACH',
	'ENETUNREACH',
	'ENOTFOUND',
	'EAI_AGAIN',
	'EDNS'
]);

function reasonOf(error: SmtpErrorFields): string {
	// One line, short: it is stored on the job and shown to editors.
	return (error.message ?? 'unknown error').replace(/\s+/g, ' ').trim().slice(0, 280);
}

export function classifySmtpError(error: SmtpErrorFields): SmtpFailure {
	const reason = reasonOf(error);
	const code = typeof error.responseCode === 'number' ? error.responseCode : null;
	if (code !== null && code >= 500 && code <= 599) return { kind: 'permanent', code, reason };
	if (code !== null && code >= 400 && code <= 499) return { kind: 'temporary', code, reason };
	if (
		NEVER_CONNECTED.has(error.originalCode ?? '') ||
		NEVER_CONNECTED.has(error.code ?? '') ||
		(error.code === 'ECONNECTION' && /connect ECONNREFUSED/.test(error.message ?? ''))
	)
		return { kind: 'temporary', code: null, reason };
	return { kind: 'unknown', code: null, reason };
}

export interface RetryPolicy {
	/** Wait before the second attempt. */
	baseMs: number;
	/** Longest wait between two attempts. */
	maxMs: number;
	/** Attempts in all; after the last temporary failure the job fails. */
	maxAttempts: number;
}

/**
 * Exponential back-off: base × 2^(attempts − 1), capped at maxMs. With the defaults
 * (1 min, 2 h, 8 attempts) the waits are 1, 2, 4, 8, 16, 32 and 64 minutes, about two hours
 * in all (common practice, no published source: mail servers retry over hours to days;
 * RFC 5321 §4.5.4.1 suggests at least 30 minutes between tries and giving up after 4–5 days
 * for relays, which a newsletter need not match).
 */
export function retryDelayMs(attemptsMade: number, policy: RetryPolicy): number {
	const exponent = Math.max(0, attemptsMade - 1);
	return Math.min(policy.maxMs, policy.baseMs * 2 ** Math.min(exponent, 30));
}

/** Whether a job that just failed temporarily gets another attempt. */
export function mayRetry(attemptsMade: number, policy: RetryPolicy): boolean {
	return attemptsMade < policy.maxAttempts;
}
