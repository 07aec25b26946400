import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// A new quote may be its part's latest active one in its region: part_region_prices follows.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE TRIGGER quotes_part_price_after_insert AFTER INSERT ON quotes FOR EACH ROW
		 CALL part_region_price_refresh(NEW.part_id, NEW.region_id)`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP TRIGGER IF EXISTS quotes_part_price_after_insert', {
		type: QueryTypes.RAW
	});
};
