import { describe, expect, it } from 'vitest';
import { sharedRead } from '$lib/server/db/shared-reads';

/** A read whose answers the test releases by hand, counting how often it was started. */
function controlledRead() {
	const started: { key: string; settle: (value: string | Error) => void }[] = [];
	const read = (key: string) =>
		new Promise<string>((resolve, reject) => {
			started.push({ key, settle: (v) => (v instanceof Error ? reject(v) : resolve(v)) });
		});
	return { started, read };
}

describe('sharedRead', () => {
	it('gives concurrent callers of one key the answer of a single read', async () => {
		const { started, read } = controlledRead();
		const shared = sharedRead(read);
		const answers = Promise.all([shared('a'), shared('a'), shared('a')]);
		expect(started).toHaveLength(1);
		started[0]?.settle('one');
		expect(await answers).toEqual(['one', 'one', 'one']);
	});

	it('keeps keys apart', async () => {
		const { started, read } = controlledRead();
		const shared = sharedRead(read);
		const a = shared('a');
		const b = shared('b');
		expect(started.map((s) => s.key)).toEqual(['a', 'b']);
		started[1]?.settle('for b');
		started[0]?.settle('for a');
		expect([await a, await b]).toEqual(['for a', 'for b']);
	});

	it('starts a new read once the last one has settled, so answers are never kept', async () => {
		const { started, read } = controlledRead();
		const shared = sharedRead(read);
		const first = shared('a');
		started[0]?.settle('old');
		await first;
		const second = shared('a');
		expect(started).toHaveLength(2);
		started[1]?.settle('new');
		expect(await second).toBe('new');
	});

	it('shares a failure with the callers waiting on it, then forgets it', async () => {
		const { started, read } = controlledRead();
		const shared = sharedRead(read);
		const waiting = [shared('a'), shared('a')];
		started[0]?.settle(new Error('database down'));
		for (const w of waiting) await expect(w).rejects.toThrow('database down');
		const retry = shared('a');
		expect(started).toHaveLength(2);
		started[1]?.settle('back');
		expect(await retry).toBe('back');
	});
});
