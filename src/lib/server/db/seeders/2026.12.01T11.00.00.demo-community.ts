import type { Seeder } from '../umzug.js';
import { removeDemoCommunity, seedDemoCommunity } from './demo-community.js';

export const up: Seeder = async ({ context: sequelize }) => {
	await seedDemoCommunity(sequelize);
};

export const down: Seeder = async ({ context: sequelize }) => {
	await removeDemoCommunity(sequelize);
};
