import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { priceKeySql } from './part-price-key.js';

/*
 * The rows for the quotes written before the triggers existed, in one statement: each
 * pair's latest active quote (observed_at, then id) keyed in its region's convention. Runs
 * after the triggers, so a quote written meanwhile is not missed; a row a trigger wrote
 * first is overwritten with the same figures.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`INSERT INTO part_region_prices (part_id, region_id, category, brand, model, quote_id, price_key)
		 SELECT part_id, region_id, category, brand, model, quote_id, price_key FROM (
		   SELECT q.part_id, q.region_id, p.category, p.brand, p.model, q.id AS quote_id,
		          ${priceKeySql('q', 'r.tax_mode', 'r.tax_rate_bp')} AS price_key,
		          ROW_NUMBER() OVER (PARTITION BY q.part_id, q.region_id
		                             ORDER BY q.observed_at DESC, q.id DESC) AS n
		     FROM quotes q
		     JOIN parts p ON p.id = q.part_id
		     JOIN regions r ON r.id = q.region_id
		    WHERE q.status = 'active') latest
		 WHERE n = 1
		 ON DUPLICATE KEY UPDATE category = VALUES(category), brand = VALUES(brand),
		   model = VALUES(model), quote_id = VALUES(quote_id),
		   price_key = VALUES(price_key)`,
		{ type: QueryTypes.RAW }
	);
};

// The rows are derived: the table's own migration drops them.
export const down: Migration = async () => {};
