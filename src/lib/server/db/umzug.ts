/*
 * Migration runner (umzug) and the shapes of migrations and seeders. Migrations change the
 * schema, one change each; seeders (seeders/index.ts) keep their own tracking table.
 * Relative imports only.
 */
import { SequelizeStorage, Umzug } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import { migrations } from './migrations/index.js';

export type Migration = (params: { name: string; context: QueryInterface }) => Promise<void>;
export interface MigrationModule {
	up: Migration;
	down: Migration;
}

export type Seeder = (params: { name: string; context: Sequelize }) => Promise<void>;
export interface SeederModule {
	up: Seeder;
	down: Seeder;
}

export function migrator(sequelize: Sequelize) {
	return new Umzug({
		migrations: Object.entries(migrations).map(([name, m]) => ({ name, up: m.up, down: m.down })),
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
		logger: undefined
	});
}
