/*
 * The scheduler's switches, from plain process.env (scripts/worker.ts runs outside Vite).
 * Like MAIL_WORKER, a value that cannot be read refuses the start rather than being guessed.
 */
import { z } from 'zod';

const TICK_MESSAGE = 'SCHEDULER_TICK_SECONDS must be a whole number of seconds from 1 to 86400';

const settings = z.object({
	SCHEDULER: z.enum(['on', 'off'], { message: 'SCHEDULER must be "on" or "off"' }).default('on'),
	SCHEDULER_TICK_SECONDS: z.coerce
		.number({ message: TICK_MESSAGE })
		.int(TICK_MESSAGE)
		.min(1, TICK_MESSAGE)
		.max(86_400, TICK_MESSAGE)
		.default(300),
	ORIGIN: z
		.url({ message: 'ORIGIN must be the site address, like https://slotwise.example' })
		.optional()
});

export interface SchedulerSettings {
	on: boolean;
	tickMs: number;
	origin: string | null;
}

/** SCHEDULER, SCHEDULER_TICK_SECONDS and ORIGIN; anything unreadable is refused, not guessed. */
export function schedulerSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): SchedulerSettings {
	const blank = (v: string | undefined) =>
		v === undefined || v.trim() === '' ? undefined : v.trim();
	const parsed = settings.safeParse({
		SCHEDULER: blank(env.SCHEDULER)?.toLowerCase(),
		SCHEDULER_TICK_SECONDS: blank(env.SCHEDULER_TICK_SECONDS),
		ORIGIN: blank(env.ORIGIN)
	});
	if (!parsed.success) throw new Error(parsed.error.issues.map((i) => i.message).join('; '));
	return {
		on: parsed.data.SCHEDULER === 'on',
		tickMs: parsed.data.SCHEDULER_TICK_SECONDS * 1000,
		origin: parsed.data.ORIGIN ? new URL(parsed.data.ORIGIN).origin : null
	};
}
