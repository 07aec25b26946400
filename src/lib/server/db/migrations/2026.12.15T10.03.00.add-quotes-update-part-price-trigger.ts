import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

/*
 * A changed quote (withdrawn, made stale, re-dated, re-priced, moved) re-keys its pair, and
 * the pair it left when it moved. Changes the key does not read (url, shipping, timestamps)
 * cost nothing.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE TRIGGER quotes_part_price_after_update AFTER UPDATE ON quotes FOR EACH ROW
		 BEGIN
		   IF NOT (NEW.part_id <=> OLD.part_id AND NEW.region_id <=> OLD.region_id) THEN
		     CALL part_region_price_refresh(OLD.part_id, OLD.region_id);
		     CALL part_region_price_refresh(NEW.part_id, NEW.region_id);
		   ELSEIF NOT (NEW.id <=> OLD.id AND NEW.status <=> OLD.status
		       AND NEW.observed_at <=> OLD.observed_at AND NEW.amount_minor <=> OLD.amount_minor
		       AND NEW.tax_included <=> OLD.tax_included) THEN
		     CALL part_region_price_refresh(NEW.part_id, NEW.region_id);
		   END IF;
		 END`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP TRIGGER IF EXISTS quotes_part_price_after_update', {
		type: QueryTypes.RAW
	});
};
