/*
 * Photo processing off the request path. The upload request checks the file (pipeline.ts
 * checkUpload), keeps the original under a key /media never serves and inserts the photo row
 * in `processing`. The row is the job: a worker claims it with a lease (jobs/lease-claim.ts,
 * the mail queue's way), makes the variants with processPhoto, writes progress after each
 * file (which also extends the lease), then moves the row to `ready` and deletes the
 * original, or to `failed` with a message and deletes the original and any files made.
 *
 * Durable: a worker that dies leaves the row `processing` with a lease that runs out; the
 * next round of any worker claims it again (attempts counts the claims, and after
 * `maxAttempts` the photo fails instead of taking the process down again and again). Every
 * write names the claim's attempt id, so a worker whose lease ran out, or whose photo was
 * cancelled (the row deleted), changes nothing and removes the files it made.
 *
 * One photo at a time per worker and one worker per app process: photos wait their turn
 * rather than take the cores from page requests. Relative imports and plain process.env
 * only (scripts and tests run it outside Vite).
 */
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { BackgroundLoop } from '../jobs/background-loop.js';
import { claimWithLease } from '../jobs/lease-claim.js';
import type { ObjectStorage } from '../storage/types.js';
import { PhotoRejected, processPhoto } from './pipeline.js';
import { removePrefix, storeFiles } from './store-photo.js';
import { positiveSetting as positive } from '../jobs/env-settings.js';

export interface PhotoJobSettings {
	/** How long a claim lasts without a progress write; each file made renews it. */
	leaseMs: number;
	/** Sleep when nothing is waiting. */
	idleMs: number;
	/** Claims of one photo before it is marked failed. */
	maxAttempts: number;
}

/*
 * One file of a 40-megapixel photo takes a few seconds here; a minute without progress
 * means the worker is gone. Common practice, no published source.
 */
export function photoJobSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): PhotoJobSettings {
	return {
		leaseMs: positive(env, 'PHOTO_LEASE_SECONDS', 60) * 1000,
		idleMs: positive(env, 'PHOTO_WORKER_IDLE_MS', 1000),
		maxAttempts: Math.floor(positive(env, 'PHOTO_MAX_ATTEMPTS', 3))
	};
}

export interface PhotoJob {
	id: number;
	keyPrefix: string;
	originalKey: string | null;
	attempts: number;
	attemptId: string;
}

export const GAVE_UP_MESSAGE =
	'Processing this photo stopped several times without finishing. Upload it again, or try a smaller copy.';
const MISSING_MESSAGE = 'The uploaded file is no longer there. Upload it again.';

class LeaseLost extends Error {}

function log(event: string, detail: Record<string, unknown> = {}): void {
	if (process.env.LOG_LEVEL === 'silent') return;
	console.log(
		JSON.stringify({ t: new Date().toISOString(), kind: 'photo_worker', event, ...detail })
	);
}

const DUE = "state = 'processing' AND (lease_until IS NULL OR lease_until < UTC_TIMESTAMP(3))";

export class PhotoWorker {
	private readonly background: BackgroundLoop;

	constructor(
		private readonly sequelize: Sequelize,
		private readonly store: () => ObjectStorage,
		private readonly settings: PhotoJobSettings
	) {
		this.background = new BackgroundLoop(
			() => this.runOnce(),
			settings.idleMs,
			(error) => log('round_failed', { error: String(error) })
		);
	}

	/** Set by stop(): claim nothing more, and give up the photo in hand at its next file. */
	private get stopping(): boolean {
		return this.background.stopped;
	}

	/** Claims the oldest waiting photo (or one whose lease ran out) and processes it; false when none. */
	async runOnce(): Promise<boolean> {
		if (this.stopping) return false;
		const { attemptId, rows } = await claimWithLease(
			this.sequelize,
			{
				table: 'photos',
				due: DUE,
				order: 'id',
				limit: 1,
				leaseMs: this.settings.leaseMs,
				set: 'attempts = attempts + 1'
			},
			(ids, transaction) => readJobs(this.sequelize, ids, transaction)
		);
		const row = rows[0];
		if (!row) return false;
		await this.process({ ...row, attemptId });
		return true;
	}

	/** Makes the variants of a claimed photo and records the outcome. */
	async process(job: PhotoJob): Promise<'ready' | 'failed' | 'lost'> {
		const store = this.store();
		if (job.attempts > this.settings.maxAttempts) return this.fail(job, GAVE_UP_MESSAGE);
		const original = job.originalKey ? await store.get(job.originalKey) : null;
		if (!original) return this.fail(job, MISSING_MESSAGE);
		let processed;
		try {
			processed = await processPhoto(original.body, (done) => this.progress(job, done));
		} catch (error) {
			if (error instanceof LeaseLost) {
				log('lease_lost', { photo: job.id });
				return 'lost';
			}
			if (error instanceof PhotoRejected && error.status !== 503)
				return this.fail(job, error.message);
			// Anything else (a busy process, a store that did not answer) is left to the lease:
			// the photo is claimed again once it runs out, up to maxAttempts. An encoder's refusal
			// is not among them: the pipeline turns it into a PhotoRejected (422), failed above.
			log('attempt_failed', { photo: job.id, error: String(error) });
			return 'lost';
		}
		const files = await storeFiles(store, processed, job.keyPrefix);
		const [, affected] = await this.sequelize.query(
			`UPDATE photos SET state = 'ready', variants = :variants, bytes = :bytes,
			 placeholder = :placeholder, width = :width, height = :height, variants_done = :done,
			 variants_total = :done, original_key = NULL, attempt_id = NULL, lease_until = NULL,
			 updated_at = UTC_TIMESTAMP(3)
			 WHERE id = :id AND attempt_id = :attemptId AND state = 'processing'`,
			{
				type: QueryTypes.UPDATE,
				replacements: {
					variants: JSON.stringify(files.variants),
					bytes: files.bytes,
					placeholder: processed.placeholder,
					width: processed.width,
					height: processed.height,
					done: files.variants.length,
					id: job.id,
					attemptId: job.attemptId
				}
			}
		);
		if (affected !== 1) {
			// Cancelled (row deleted) or claimed by another worker meanwhile: ours are not wanted.
			if (!(await this.claimedByAnother(job))) await removePrefix(store, job.keyPrefix);
			log('lease_lost', { photo: job.id });
			return 'lost';
		}
		if (job.originalKey) await store.delete([job.originalKey]);
		log('ready', { photo: job.id, files: files.variants.length });
		return 'ready';
	}

	private async progress(job: PhotoJob, done: number): Promise<void> {
		const [, affected] = await this.sequelize.query(
			`UPDATE photos SET variants_done = :done,
			 lease_until = UTC_TIMESTAMP(3) + INTERVAL :leaseUs MICROSECOND
			 WHERE id = :id AND attempt_id = :attemptId AND state = 'processing'`,
			{
				type: QueryTypes.UPDATE,
				replacements: {
					done,
					leaseUs: this.settings.leaseMs * 1000,
					id: job.id,
					attemptId: job.attemptId
				}
			}
		);
		if (affected !== 1 || this.stopping) throw new LeaseLost();
	}

	private async claimedByAnother(job: PhotoJob): Promise<boolean> {
		const [row] = await this.sequelize.query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM photos WHERE id = :id AND state = 'processing'`,
			{ type: QueryTypes.SELECT, replacements: { id: job.id } }
		);
		return Number(row?.n ?? 0) > 0;
	}

	/** `failed` with the message for the uploader; the original and any files made are removed. */
	private async fail(job: PhotoJob, message: string): Promise<'failed' | 'lost'> {
		const [, affected] = await this.sequelize.query(
			`UPDATE photos SET state = 'failed', failure = :message, bytes = 0, variants = '[]',
			 original_key = NULL, attempt_id = NULL, lease_until = NULL, updated_at = UTC_TIMESTAMP(3)
			 WHERE id = :id AND attempt_id = :attemptId AND state = 'processing'`,
			{
				type: QueryTypes.UPDATE,
				replacements: { message: message.slice(0, 300), id: job.id, attemptId: job.attemptId }
			}
		);
		if (affected !== 1) return 'lost';
		const store = this.store();
		await removePrefix(store, job.keyPrefix);
		if (job.originalKey) await store.delete([job.originalKey]);
		log('failed', { photo: job.id, message });
		return 'failed';
	}

	/** Runs rounds in the background until stop(). */
	start(): void {
		this.background.start();
	}

	/** Ends the loop after the photo in hand stops at its next file; its lease lets another take it. */
	stop(): Promise<void> {
		return this.background.stop();
	}

	/** Wakes a sleeping loop (the upload calls it). */
	poke(): void {
		this.background.poke();
	}

	/** Tests and the seed: rounds until no photo is waiting for a claim. */
	async drain(): Promise<void> {
		while (await this.runOnce());
	}
}

async function readJobs(
	sequelize: Sequelize,
	ids: number[],
	transaction: Transaction
): Promise<Omit<PhotoJob, 'attemptId'>[]> {
	const rows = await sequelize.query<Omit<PhotoJob, 'attemptId'>>(
		`SELECT id, key_prefix AS keyPrefix, original_key AS originalKey, attempts
		 FROM photos WHERE id IN (:ids)`,
		{ type: QueryTypes.SELECT, transaction, replacements: { ids } }
	);
	return rows.map((r) => ({ ...r, id: Number(r.id), attempts: Number(r.attempts) }));
}

/**
 * Claims one photo the caller just inserted, inside the caller's transaction, so no worker
 * takes it: for uploads that are processed while the request waits (parts and builds).
 */
export async function claimForCaller(
	sequelize: Sequelize,
	id: number,
	settings: PhotoJobSettings,
	transaction: Transaction
): Promise<string> {
	const attemptId = randomUUID();
	await sequelize.query(
		`UPDATE photos SET attempt_id = :attemptId, attempts = 1,
		 lease_until = UTC_TIMESTAMP(3) + INTERVAL :leaseUs MICROSECOND WHERE id = :id`,
		{
			type: QueryTypes.UPDATE,
			transaction,
			replacements: { attemptId, leaseUs: settings.leaseMs * 1000, id }
		}
	);
	return attemptId;
}

export type WaitedOutcome =
	{ state: 'ready' } | { state: 'failed'; message: string } | { state: 'lost' };

/**
 * Processes a photo that claimForCaller claimed, while its uploader waits. Ready, whichever
 * worker finished it (another takes over a claim whose lease ran out). Anything else (refused,
 * lost to another worker, broken off by an error) leaves nothing: not the row, not the
 * original, not a file either worker made. A failure's files the job removes itself; a lost
 * claim keeps the original and may have left files.
 */
export async function processWhileWaiting(
	sequelize: Sequelize,
	store: () => ObjectStorage,
	settings: PhotoJobSettings,
	job: PhotoJob & { originalKey: string }
): Promise<WaitedOutcome> {
	const discard = async () => {
		await sequelize.query('DELETE FROM photos WHERE id = :id', {
			type: QueryTypes.DELETE,
			replacements: { id: job.id }
		});
		await store().delete([job.originalKey]);
		await removePrefix(store(), job.keyPrefix);
	};
	try {
		await new PhotoWorker(sequelize, store, settings).process(job);
	} catch (error) {
		await discard().catch(() => undefined);
		throw error;
	}
	const [row] = await sequelize.query<{ state: string; failure: string | null }>(
		'SELECT state, failure FROM photos WHERE id = :id',
		{ type: QueryTypes.SELECT, replacements: { id: job.id } }
	);
	if (row?.state === 'ready') return { state: 'ready' };
	await discard();
	if (row?.state === 'failed')
		return { state: 'failed', message: row.failure ?? 'The photo could not be processed.' };
	log('waited_lost', { photo: job.id });
	return { state: 'lost' };
}
