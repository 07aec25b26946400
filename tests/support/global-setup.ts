/*
 * Integration tests run on the real project-local MariaDB (scripts/db.sh start), in their
 * own database. The schema is migrated once here; tests reset rows, never the schema.
 */
import { createSequelize, dbConfigFromEnv } from '../../src/lib/server/db/connection';
import { migrator } from '../../src/lib/server/db/umzug';

export default async function setup() {
	const config = { ...dbConfigFromEnv(), database: process.env.DB_NAME ?? 'slotwise_test' };
	const sequelize = createSequelize(config);
	try {
		await sequelize.authenticate();
	} catch (e) {
		throw new Error(
			`Integration tests need MariaDB on ${config.host}:${config.port} (run: bash scripts/db.sh start). ${String(e)}`,
			{ cause: e }
		);
	}
	await migrator(sequelize).up();
	await sequelize.close();
}
