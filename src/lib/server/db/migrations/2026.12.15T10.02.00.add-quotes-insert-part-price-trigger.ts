import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// A new active quote may be its part's latest in its region: part_region_prices follows. A
// quote written as stale or withdrawn changes nothing (bulk loads skip the work for it).
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE TRIGGER quotes_part_price_after_insert AFTER INSERT ON quotes FOR EACH ROW
		 BEGIN
		   IF NEW.status = 'active' THEN
		     CALL part_region_price_refresh(NEW.part_id, NEW.region_id);
		   END IF;
		 END`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP TRIGGER IF EXISTS quotes_part_price_after_insert', {
		type: QueryTypes.RAW
	});
};
