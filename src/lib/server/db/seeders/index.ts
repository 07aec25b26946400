import { SequelizeStorage, Umzug } from 'umzug';
import type { Sequelize } from 'sequelize';
import type { SeederModule } from '../umzug.js';
import * as demo from './2026.12.01T11.00.00.demo-community.js';
import * as demoFxRates from './2026.12.02T11.00.00.demo-fx-rates.js';
import * as demoCautionRules from './2026.12.05T12.00.00.demo-caution-rules.js';
import * as demoBuilds from './2026.12.06T11.00.00.demo-builds.js';
import * as demoPhotos from './2026.12.08T10.00.00.demo-photos.js';
import * as storedGuidePrices from './2026.12.09T12.00.00.stored-guide-prices.js';

/** Ordered seeders; each is idempotent on its own (natural keys), tracking aside. */
export const seeders: Record<string, SeederModule> = {
	'2026.12.01T11.00.00.demo-community': demo,
	'2026.12.02T11.00.00.demo-fx-rates': demoFxRates,
	'2026.12.05T12.00.00.demo-caution-rules': demoCautionRules,
	'2026.12.06T11.00.00.demo-builds': demoBuilds,
	'2026.12.08T10.00.00.demo-photos': demoPhotos,
	'2026.12.09T12.00.00.stored-guide-prices': storedGuidePrices
};

export function seeder(sequelize: Sequelize) {
	return new Umzug({
		migrations: Object.entries(seeders).map(([name, s]) => ({ name, up: s.up, down: s.down })),
		context: sequelize,
		// Own model name: umzug reuses a model already defined under the default name
		// ('SequelizeMeta', the migrator's), which would log seeders into schema_migrations.
		storage: new SequelizeStorage({
			sequelize,
			tableName: 'schema_seeders',
			modelName: 'SeederMeta'
		}),
		logger: undefined
	});
}
