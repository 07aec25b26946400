import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// The catalog's order (brand, model, id) read from an index rather than sorted, and the
// prefix LIKE that stands in for the full-text index for words too short for it.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('CREATE INDEX parts_brand_model ON parts (brand, model, id)', {
		type: QueryTypes.RAW
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX parts_brand_model ON parts', { type: QueryTypes.RAW });
};
