import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

/*
 * A deleted active quote may have been the latest: its pair falls back to the previous
 * active quote or loses its row. (Quotes deleted by a part's cascade fire no trigger; the part's
 * own rows cascade away with it.)
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE TRIGGER quotes_part_price_after_delete AFTER DELETE ON quotes FOR EACH ROW
		 BEGIN
		   IF OLD.status = 'active' THEN
		     CALL part_region_price_refresh(OLD.part_id, OLD.region_id);
		   END IF;
		 END`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP TRIGGER IF EXISTS quotes_part_price_after_delete', {
		type: QueryTypes.RAW
	});
};
