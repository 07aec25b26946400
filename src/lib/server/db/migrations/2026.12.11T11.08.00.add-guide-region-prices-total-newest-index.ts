import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// "Lowest total, newest first among equals" mixes directions (total ascending, date and
// revision descending): only an index with those directions serves it without a sort.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'CREATE INDEX guide_region_prices_region_total_newest ON guide_region_prices (region_id, total_sort, published_at DESC, revision_id DESC)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'DROP INDEX guide_region_prices_region_total_newest ON guide_region_prices',
		{ type: QueryTypes.RAW }
	);
};
