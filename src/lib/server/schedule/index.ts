/*
 * The scheduler beside the mail worker: the app process starts it where it runs its inline
 * worker (MAIL_WORKER on, src/hooks.server.ts), and every `npm run worker` process starts one
 * (scripts/worker.ts). Several at once are safe (scheduler.ts). SCHEDULER=off leaves a
 * process without one; SCHEDULER_TICK_SECONDS sets how often it looks (default 300).
 */
import { db } from '$lib/server/db/connection';
import { Scheduler } from './scheduler';
import { schedulerSettingsFromEnv } from './settings';

export { Scheduler } from './scheduler';
export type { SchedulerOptions, TickResult } from './scheduler';
export { schedulerSettingsFromEnv, type SchedulerSettings } from './settings';

let running: Scheduler | null = null;

/** Starts this process's scheduler (once), unless SCHEDULER=off. */
export function startScheduler(env: NodeJS.ProcessEnv = process.env): Scheduler | null {
	if (running) return running;
	const wanted = schedulerSettingsFromEnv(env);
	if (!wanted.on) return null;
	running = new Scheduler({ sequelize: db(), origin: wanted.origin, tickMs: wanted.tickMs });
	running.start();
	return running;
}

export async function stopScheduler(): Promise<void> {
	const scheduler = running;
	running = null;
	await scheduler?.stop();
}
