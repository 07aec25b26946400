import { describe, expect, it } from 'vitest';
import { schedulerSettingsFromEnv } from '../../src/lib/server/schedule/settings';

/*
 * The scheduler's switches (docs/deployment.md §5): on by default every 300 s, off on
 * request, and a value that cannot be read stops the start instead of being guessed.
 */
describe('scheduler settings', () => {
	it('is on every 300 seconds by default, with the origin of ORIGIN for the digest links', () => {
		expect(schedulerSettingsFromEnv({})).toEqual({ on: true, tickMs: 300_000, origin: null });
		expect(
			schedulerSettingsFromEnv({
				SCHEDULER: ' OFF ',
				SCHEDULER_TICK_SECONDS: '60',
				ORIGIN: 'https://slotwise.example/some/path'
			})
		).toEqual({ on: false, tickMs: 60_000, origin: 'https://slotwise.example' });
	});

	it('refuses a switch, a tick or an origin it cannot read', () => {
		expect(() => schedulerSettingsFromEnv({ SCHEDULER: 'sometimes' })).toThrow(
			'SCHEDULER must be "on" or "off"'
		);
		for (const tick of ['0', '1.5', 'soon', '86401'])
			expect(() => schedulerSettingsFromEnv({ SCHEDULER_TICK_SECONDS: tick }), tick).toThrow(
				'SCHEDULER_TICK_SECONDS must be a whole number of seconds from 1 to 86400'
			);
		expect(() => schedulerSettingsFromEnv({ ORIGIN: 'slotwise' })).toThrow(
			'ORIGIN must be the site address'
		);
	});
});
