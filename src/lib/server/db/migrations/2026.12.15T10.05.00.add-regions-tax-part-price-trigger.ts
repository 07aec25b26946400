import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { priceKeySql } from './part-price-key.js';

/*
 * A region's tax mode or rate changes how its quotes compare: its rows are re-keyed in one
 * statement. Which quote is latest does not depend on tax, so quote_id stays.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE TRIGGER regions_part_price_after_update AFTER UPDATE ON regions FOR EACH ROW
		 BEGIN
		   IF NOT (NEW.tax_mode <=> OLD.tax_mode AND NEW.tax_rate_bp <=> OLD.tax_rate_bp) THEN
		     UPDATE part_region_prices pp JOIN quotes q ON q.id = pp.quote_id
		        SET pp.price_key = ${priceKeySql('q', 'NEW.tax_mode', 'NEW.tax_rate_bp')}
		      WHERE pp.region_id = NEW.id;
		   END IF;
		 END`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP TRIGGER IF EXISTS regions_part_price_after_update', {
		type: QueryTypes.RAW
	});
};
