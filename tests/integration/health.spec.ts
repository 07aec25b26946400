import { describe, expect, it } from 'vitest';
import { createSequelize, dbConfigFromEnv } from '../../src/lib/server/db/connection';
import * as health from '../../src/lib/server/services/health';

describe('health check', () => {
	it('reports the database up when MariaDB answers', async () => {
		expect(await health.check()).toEqual({ status: 'ok', db: 'up' });
	});

	it('reports it down within 2 s when nothing listens on the configured port', async () => {
		// A real connection attempt to a closed loopback port; the outage test with a
		// stopped MariaDB and the built server is in tests/e2e/health.e2e.ts.
		const unreachable = createSequelize({ ...dbConfigFromEnv(), port: 1 });
		const started = Date.now();
		try {
			expect(await health.check(unreachable)).toEqual({ status: 'degraded', db: 'down' });
			expect(Date.now() - started).toBeLessThan(2_000);
		} finally {
			await unreachable.close();
		}
	});
});
