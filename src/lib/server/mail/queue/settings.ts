/*
 * The mail queue's knobs, from plain process.env (the worker also runs outside Vite).
 * Defaults suit a real relay; tests and the crash test shorten the lease and the back-off.
 */
import { z } from 'zod';
import type { RetryPolicy } from '../../../domain/mail-delivery.js';
import { positiveSetting as positive } from '../../jobs/env-settings.js';

export interface QueueSettings {
	/** Jobs claimed per round; several rounds run one after another. */
	batchSize: number;
	/** Messages in flight at once: the pooled transport's connections. */
	concurrency: number;
	/**
	 * How long a claimed job belongs to its worker. Only after the lease has run out may
	 * another worker look at a job still marked `sending`, so it must be longer than any send
	 * can take (nodemailer's connection, greeting and socket timeouts: 10 + 10 + 30 s).
	 */
	leaseMs: number;
	/** No send starts later than this before the lease ends (the longest a send may take). */
	sendGuardMs: number;
	/** Sleep when nothing is due. */
	idleMs: number;
	retry: RetryPolicy;
}

export function queueSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): QueueSettings {
	const concurrency = Math.floor(positive(env, 'MAIL_WORKER_CONCURRENCY', 5));
	const leaseMs = positive(env, 'MAIL_LEASE_SECONDS', 600) * 1000;
	const sendGuardMs = Math.min(positive(env, 'MAIL_SEND_GUARD_SECONDS', 60) * 1000, leaseMs / 2);
	return {
		batchSize: Math.floor(positive(env, 'MAIL_WORKER_BATCH', concurrency * 10)),
		concurrency,
		leaseMs,
		sendGuardMs,
		idleMs: positive(env, 'MAIL_WORKER_IDLE_MS', 1000),
		retry: {
			baseMs: positive(env, 'MAIL_RETRY_BASE_SECONDS', 60) * 1000,
			maxMs: positive(env, 'MAIL_RETRY_MAX_SECONDS', 7200) * 1000,
			maxAttempts: Math.floor(positive(env, 'MAIL_MAX_ATTEMPTS', 8))
		}
	};
}

const workerSwitch = z
	.enum(['on', 'off'], { message: 'MAIL_WORKER must be "on" or "off"' })
	.default('on');

/**
 * Whether this app process sends queued mail itself (MAIL_WORKER, default "on"). `npm start`
 * on one machine needs it on; behind a proxy, the app processes may set it "off" and leave
 * the sending to `npm run worker` processes (docs/deployment.md §5). Either way is safe: any
 * number of workers share the queue through row locks. Anything but on/off is refused at
 * start rather than read as one or the other.
 */
export function inlineWorkerWanted(env: NodeJS.ProcessEnv = process.env): boolean {
	const raw = env.MAIL_WORKER?.trim().toLowerCase();
	const parsed = workerSwitch.safeParse(raw === '' ? undefined : raw);
	if (!parsed.success)
		throw new Error(`${parsed.error.issues[0]?.message} (got "${env.MAIL_WORKER}")`);
	return parsed.data === 'on';
}
