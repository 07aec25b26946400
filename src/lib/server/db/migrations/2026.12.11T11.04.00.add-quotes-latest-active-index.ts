import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// The latest active quote of a part in a region (pricing, the catalog's price column and
// its price sort) found at the end of one index range, without reading withdrawn rows.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'CREATE INDEX quotes_part_region_status_observed ON quotes (part_id, region_id, status, observed_at)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX quotes_part_region_status_observed ON quotes', {
		type: QueryTypes.RAW
	});
};
