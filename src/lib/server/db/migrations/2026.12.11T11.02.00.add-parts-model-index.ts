import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// A short word may begin the model rather than the brand: its prefix LIKE needs this one
// too (the optimiser merges the two ranges).
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('CREATE INDEX parts_model ON parts (model)', { type: QueryTypes.RAW });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX parts_model ON parts', { type: QueryTypes.RAW });
};
