/*
 * tsx scripts/migrate.ts up|down|down-all|status — runs outside Vite against DB_* env.
 */
import { createSequelize } from '../src/lib/server/db/connection.js';
import { migrator } from '../src/lib/server/db/umzug.js';

const command = process.argv[2] ?? 'up';
const sequelize = createSequelize();
try {
	const umzug = migrator(sequelize);
	if (command === 'up') {
		const done = await umzug.up();
		console.log(`[migrate] ${done.length} migration(s) applied on ${sequelize.getDatabaseName()}`);
	} else if (command === 'down') {
		const done = await umzug.down();
		console.log(`[migrate] reverted ${done.map((m) => m.name).join(', ') || 'nothing'}`);
	} else if (command === 'down-all') {
		const done = await umzug.down({ to: 0 });
		console.log(`[migrate] reverted ${done.length} migration(s)`);
	} else if (command === 'status') {
		const pending = await umzug.pending();
		console.log(`[migrate] pending: ${pending.map((m) => m.name).join(', ') || 'none'}`);
	} else {
		console.error('usage: tsx scripts/migrate.ts up|down|down-all|status');
		process.exitCode = 2;
	}
} catch (e) {
	console.error(`[migrate] FAILED: ${e instanceof Error ? e.message : String(e)}`);
	process.exitCode = 1;
} finally {
	await sequelize.close();
}
