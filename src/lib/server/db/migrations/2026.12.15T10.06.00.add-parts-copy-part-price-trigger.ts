import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// part_region_prices copies a part's category, brand and model: an edited part moves with it.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE TRIGGER parts_part_price_after_update AFTER UPDATE ON parts FOR EACH ROW
		 BEGIN
		   IF NOT (NEW.category <=> OLD.category AND NEW.brand <=> OLD.brand
		       AND NEW.model <=> OLD.model) THEN
		     UPDATE part_region_prices
		        SET category = NEW.category, brand = NEW.brand, model = NEW.model
		      WHERE part_id = NEW.id;
		   END IF;
		 END`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP TRIGGER IF EXISTS parts_part_price_after_update', {
		type: QueryTypes.RAW
	});
};
