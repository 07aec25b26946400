import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// One category of the catalog in its order (brand, model, id) without a sort.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'CREATE INDEX parts_category_brand_model ON parts (category, brand, model, id)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX parts_category_brand_model ON parts', {
		type: QueryTypes.RAW
	});
};
