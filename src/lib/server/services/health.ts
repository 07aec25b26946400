/**
 * Liveness of the app's dependencies. The probe is bounded in time: a load balancer must
 * get an answer within 2 s even when MariaDB hangs or is gone.
 */
import { QueryTypes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { sequelize as shared } from '$lib/server/db';

export interface HealthReport {
	status: 'ok' | 'degraded';
	db: 'up' | 'down';
}

export async function check(
	sequelize: Sequelize = shared,
	timeoutMs = 1_500
): Promise<HealthReport> {
	let timer: NodeJS.Timeout | undefined;
	const timeout = new Promise<false>((resolve) => {
		timer = setTimeout(() => resolve(false), timeoutMs);
	});
	// With a read replica a plain SELECT asks only the replica; the primary, which takes
	// every write, is asked as well (without a replica both go to the same server).
	const ping = Promise.all([
		sequelize.query('SELECT 1 AS ok', { type: QueryTypes.SELECT, useMaster: true }),
		sequelize.query('SELECT 1 AS ok', { type: QueryTypes.SELECT })
	])
		.then(() => true)
		.catch(() => false);
	try {
		const up = await Promise.race([ping, timeout]);
		return up ? { status: 'ok', db: 'up' } : { status: 'degraded', db: 'down' };
	} finally {
		clearTimeout(timer);
	}
}
