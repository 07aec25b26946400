import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { priceKeySql } from './part-price-key.js';

/*
 * part_region_price_refresh(part, region): the part_region_prices row of one part in one
 * region worked out again from its quotes (gone when no active quote is left). The quotes
 * triggers call it for every pair a written quote belongs to; the latest active quote is
 * one dive into quotes_part_region_status_observed.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`CREATE PROCEDURE part_region_price_refresh(IN in_part_id INT UNSIGNED, IN in_region_id INT UNSIGNED)
		 MODIFIES SQL DATA
		 BEGIN
		   DELETE FROM part_region_prices WHERE part_id = in_part_id AND region_id = in_region_id;
		   INSERT INTO part_region_prices (part_id, region_id, category, brand, model, quote_id, price_key)
		   SELECT q.part_id, q.region_id, p.category, p.brand, p.model, q.id, ${priceKeySql('q', 'r.tax_mode', 'r.tax_rate_bp')}
		     FROM quotes q
		     JOIN parts p ON p.id = q.part_id
		     JOIN regions r ON r.id = q.region_id
		    WHERE q.part_id = in_part_id AND q.region_id = in_region_id AND q.status = 'active'
		    ORDER BY q.observed_at DESC, q.id DESC
		    LIMIT 1;
		 END`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP PROCEDURE IF EXISTS part_region_price_refresh', {
		type: QueryTypes.RAW
	});
};
