/*
 * The scheduler beside the mail worker: the app process starts it where it runs its inline
 * worker (MAIL_WORKER on, src/hooks.server.ts), and every `npm run worker` process starts one
 * (scripts/worker.ts). Several at once are safe (scheduler.ts). SCHEDULER=off leaves a
 * process without one; SCHEDULER_TICK_SECONDS sets how often it looks (default 300).
 */
import { z } from 'zod';
import { db } from '$lib/server/db/connection';
import { Scheduler } from './scheduler';

export { Scheduler } from './scheduler';
export type { SchedulerOptions, TickResult } from './scheduler';

const settings = z.object({
	SCHEDULER: z.enum(['on', 'off'], { message: 'SCHEDULER must be "on" or "off"' }).default('on'),
	SCHEDULER_TICK_SECONDS: z.coerce
		.number({ message: 'SCHEDULER_TICK_SECONDS must be a number of seconds' })
		.int()
		.min(1)
		.max(86_400)
		.default(300),
	ORIGIN: z
		.url({ message: 'ORIGIN must be the site address, like https://slotwise.example' })
		.optional()
});

let running: Scheduler | null = null;

/** Starts this process's scheduler (once); refuses bad settings rather than guess. */
export function startScheduler(env: NodeJS.ProcessEnv = process.env): Scheduler | null {
	if (running) return running;
	const blank = (v: string | undefined) =>
		v === undefined || v.trim() === '' ? undefined : v.trim();
	const parsed = settings.safeParse({
		SCHEDULER: blank(env.SCHEDULER)?.toLowerCase(),
		SCHEDULER_TICK_SECONDS: blank(env.SCHEDULER_TICK_SECONDS),
		ORIGIN: blank(env.ORIGIN)
	});
	if (!parsed.success) throw new Error(parsed.error.issues.map((i) => i.message).join('; '));
	if (parsed.data.SCHEDULER === 'off') return null;
	running = new Scheduler({
		sequelize: db(),
		origin: parsed.data.ORIGIN ? new URL(parsed.data.ORIGIN).origin : null,
		tickMs: parsed.data.SCHEDULER_TICK_SECONDS * 1000
	});
	running.start();
	return running;
}

export async function stopScheduler(): Promise<void> {
	const scheduler = running;
	running = null;
	await scheduler?.stop();
}
