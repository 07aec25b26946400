import { afterAll, afterEach } from 'vitest';
import { settled } from '../../src/lib/server/background';
import { closeDb } from '../../src/lib/server/db';

// Work a service left running after its answer (mail, a full price pass) ends inside the test
// that started it, not in the next test's fresh database or after the pool closed.
afterEach(async () => {
	await settled();
});

afterAll(async () => {
	await closeDb();
});
