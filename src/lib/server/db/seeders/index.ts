import { SequelizeStorage, Umzug } from 'umzug';
import type { Sequelize } from 'sequelize';
import type { SeederModule } from '../umzug.js';
import * as demo from './2026.12.01T11.00.00.demo-community.js';

/** Ordered seeders; each is idempotent on its own (natural keys), tracking aside. */
export const seeders: Record<string, SeederModule> = {
	'2026.12.01T11.00.00.demo-community': demo
};

export function seeder(sequelize: Sequelize) {
	return new Umzug({
		migrations: Object.entries(seeders).map(([name, s]) => ({ name, up: s.up, down: s.down })),
		context: sequelize,
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_seeders' }),
		logger: undefined
	});
}
