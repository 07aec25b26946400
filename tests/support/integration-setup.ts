import { afterAll } from 'vitest';
import { closeDb } from '../../src/lib/server/db';

afterAll(async () => {
	await closeDb();
});
