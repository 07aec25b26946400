import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// Parts search by brand and model (services/parts.ts): MATCH … AGAINST instead of a scan
// of LIKE '%word%' over the whole catalog.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'CREATE FULLTEXT INDEX parts_brand_model_fulltext ON parts (brand, model)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX parts_brand_model_fulltext ON parts', {
		type: QueryTypes.RAW
	});
};
