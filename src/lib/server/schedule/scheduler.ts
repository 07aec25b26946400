/**
 * Periodic jobs that no request triggers, run beside the mail worker (wherever MAIL_WORKER is
 * on, and in every `npm run worker` process: schedule/index.ts). Two jobs, in this order:
 *
 * - `upkeep-staleness`, once per UTC day: recomputes every published guide's stored figures
 *   and upkeep alerts (guide-prices.ts refreshAll) at the current time, so a pick's newest
 *   quote passing 30 days raises its alert without any other event;
 * - `upkeep-digest`, once per ISO week: queues each opted-in author's digest
 *   (upkeep-digest.ts). The first tick of a week decides it, after that day's staleness pass.
 *
 * Any number of processes may run a scheduler. Each job and period has one row in
 * scheduled_runs: the process whose INSERT lands runs it and marks it finished; a failure
 * deletes the row so a later tick tries again; a row left unfinished for longer than the
 * lease (its process died) may be taken over. The jobs are safe to run twice anyway (the
 * pass recomputes; each digest is decided once per author and week under a row lock), so
 * the row is about not doing the work in every process, not about correctness.
 *
 * The clock is a parameter, so tests run days and weeks in a moment.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { isoWeek, utcDay } from '$lib/domain/iso-week';
import { refreshAll } from '$lib/server/services/guide-prices';
import { queueWeeklyDigests, type DigestRun } from '$lib/server/services/upkeep-digest';
import { BackgroundLoop } from '$lib/server/jobs/background-loop';

export type SchedulerLog = (event: string, detail?: Record<string, unknown>) => void;

export interface SchedulerOptions {
	sequelize: Sequelize;
	/** Absolute links in the digest; without one no digest is queued (logged once). */
	origin: string | null;
	now?: () => Date;
	/** Between ticks. */
	tickMs?: number;
	/** How long a started run belongs to its process before another may take it over. */
	leaseMs?: number;
	log?: SchedulerLog;
}

export interface TickResult {
	/** The UTC day whose staleness pass this tick ran, or null. */
	staleness: string | null;
	/** The week's digest decisions when this tick ran them, or null. */
	digests: DigestRun | null;
}

const HOUR_MS = 3_600_000;

function defaultLog(event: string, detail: Record<string, unknown> = {}): void {
	if (process.env.LOG_LEVEL === 'silent') return;
	console.log(JSON.stringify({ t: new Date().toISOString(), kind: 'scheduler', event, ...detail }));
}

export class Scheduler {
	private readonly sequelize: Sequelize;
	private readonly origin: string | null;
	private readonly now: () => Date;
	private readonly tickMs: number;
	private readonly leaseMs: number;
	private readonly log: SchedulerLog;
	private warnedNoOrigin = false;
	private readonly background: BackgroundLoop;

	constructor(options: SchedulerOptions) {
		this.sequelize = options.sequelize;
		this.origin = options.origin;
		this.now = options.now ?? (() => new Date());
		this.tickMs = options.tickMs ?? 5 * 60_000;
		this.leaseMs = options.leaseMs ?? 2 * HOUR_MS;
		this.log = options.log ?? defaultLog;
		// Every tick is followed by a full pause: the jobs are due by day and by week.
		this.background = new BackgroundLoop(
			async () => {
				await this.runOnce();
				return false;
			},
			this.tickMs,
			(error) => this.log('tick_failed', { error: String(error) })
		);
	}

	/** Runs whatever is due now: the day's staleness pass, then the week's digests. */
	async runOnce(): Promise<TickResult> {
		const now = this.now();
		const result: TickResult = { staleness: null, digests: null };
		const day = utcDay(now);
		if (await this.run('upkeep-staleness', day, now, () => refreshAll({ now })))
			result.staleness = day;
		if (!this.origin) {
			if (!this.warnedNoOrigin)
				this.log('digest_skipped', { reason: 'ORIGIN is not set, so links cannot be made' });
			this.warnedNoOrigin = true;
			return result;
		}
		const origin = this.origin;
		await this.run('upkeep-digest', isoWeek(now), now, async () => {
			result.digests = await queueWeeklyDigests(origin, now);
			this.log('digests', { ...result.digests });
		});
		return result;
	}

	/** Ticks in the background until stop(). */
	start(): void {
		this.background.start();
	}

	/** Ends the loop after the job in hand. */
	stop(): Promise<void> {
		return this.background.stop();
	}

	/** Claims (job, period), runs `work`, marks it finished; false when another has it or had it. */
	private async run(
		job: string,
		period: string,
		now: Date,
		work: () => Promise<unknown>
	): Promise<boolean> {
		if (!(await this.claim(job, period, now))) return false;
		try {
			await work();
		} catch (error) {
			// Let a later tick (here or elsewhere) try again.
			await this.sequelize.query(
				'DELETE FROM scheduled_runs WHERE job = :job AND period = :period AND finished_at IS NULL',
				{ type: QueryTypes.DELETE, replacements: { job, period } }
			);
			throw error;
		}
		await this.sequelize.query(
			'UPDATE scheduled_runs SET finished_at = :now WHERE job = :job AND period = :period',
			{ type: QueryTypes.UPDATE, replacements: { job, period, now: this.now() } }
		);
		this.log('ran', { job, period });
		return true;
	}

	private async claim(job: string, period: string, now: Date): Promise<boolean> {
		const [, inserted] = await this.sequelize.query(
			'INSERT IGNORE INTO scheduled_runs (job, period, started_at) VALUES (:job, :period, :now)',
			{ type: QueryTypes.INSERT, replacements: { job, period, now } }
		);
		if (Number(inserted) === 1) return true;
		const [, taken] = await this.sequelize.query(
			`UPDATE scheduled_runs SET started_at = :now
			  WHERE job = :job AND period = :period AND finished_at IS NULL AND started_at < :expired`,
			{
				type: QueryTypes.UPDATE,
				replacements: { job, period, now, expired: new Date(now.getTime() - this.leaseMs) }
			}
		);
		return Number(taken) === 1;
	}
}
