/*
 * tsx scripts/seed.ts up|down — loads (or removes) the invented demo community.
 * Production deployments run migrations only and seed nothing.
 */
import { db } from '../src/lib/server/db/connection.js';
import { seeder } from '../src/lib/server/db/seeders/index.js';

const command = process.argv[2] ?? 'up';
const sequelize = db();
try {
	const umzug = seeder(sequelize);
	if (command === 'up') {
		const done = await umzug.up();
		console.log(`[seed] ${done.length} seeder(s) applied on ${sequelize.getDatabaseName()}`);
	} else if (command === 'down') {
		const done = await umzug.down({ to: 0 });
		console.log(`[seed] reverted ${done.length} seeder(s)`);
	} else {
		console.error('usage: tsx scripts/seed.ts up|down');
		process.exitCode = 2;
	}
} catch (e) {
	console.error(`[seed] FAILED: ${e instanceof Error ? e.message : String(e)}`);
	process.exitCode = 1;
} finally {
	await sequelize.close();
}
