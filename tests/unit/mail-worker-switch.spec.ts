import { describe, expect, it } from 'vitest';
import { inlineWorkerWanted } from '../../src/lib/server/mail/queue/settings';
import { startInlineWorker } from '../../src/lib/server/mail/queue/inline';

/*
 * MAIL_WORKER decides whether an app process sends queued mail itself (docs/deployment.md §5):
 * on by default, so `npm start` alone delivers mail; "off" where `npm run worker` processes
 * do the sending. A typo must stop the start, not silently pick a side.
 */
describe('MAIL_WORKER', () => {
	it('is on when unset or empty, and reads on/off in any case', () => {
		expect(inlineWorkerWanted({})).toBe(true);
		expect(inlineWorkerWanted({ MAIL_WORKER: '' })).toBe(true);
		expect(inlineWorkerWanted({ MAIL_WORKER: 'on' })).toBe(true);
		expect(inlineWorkerWanted({ MAIL_WORKER: 'off' })).toBe(false);
		expect(inlineWorkerWanted({ MAIL_WORKER: ' OFF ' })).toBe(false);
	});

	it('refuses anything else with a message naming the variable', () => {
		for (const value of ['0', 'false', 'no', 'of', 'disabled'])
			expect(() => inlineWorkerWanted({ MAIL_WORKER: value }), value).toThrow(
				/MAIL_WORKER must be "on" or "off"/
			);
	});

	it('off: the app process starts no worker (and opens no database connection for one)', () => {
		expect(startInlineWorker({ MAIL_WORKER: 'off' })).toBeNull();
	});
});
