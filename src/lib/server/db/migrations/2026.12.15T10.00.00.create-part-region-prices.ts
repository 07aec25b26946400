import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { references } from './columns.js';

/*
 * Each part's price sort key in each region where it has an active quote: the key of its
 * latest active quote there (observed_at, then id), in the region's tax convention
 * (part-price-key.ts). The catalog sorted by price used to work the key out per part on
 * every request, a subquery for each matching part before ORDER BY and LIMIT could start;
 * stored, the sort reads one index range. Kept current by triggers on quotes, regions and
 * parts (the next migrations), so every writer of quotes (editor form, CSV import, accepted
 * sightings, approved proposals, seeds, plain SQL) keeps it right inside its own transaction.
 *
 * category, brand and model are copies of the part's: a category page sorted by price walks
 * (region_id, category, price_key, brand, model, part_id) in order and stops at LIMIT, the
 * tie-break included (equal prices by brand and model, as the name order). Without brand
 * and model here every priced part of the range would be joined to parts and sorted first.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('part_region_prices', {
		part_id: { ...references('parts', 'CASCADE'), primaryKey: true },
		region_id: { ...references('regions', 'CASCADE'), primaryKey: true },
		category: { type: DataTypes.STRING(16), allowNull: false },
		brand: { type: DataTypes.STRING(80), allowNull: false },
		model: { type: DataTypes.STRING(120), allowNull: false },
		// The quote the key came from (a withdrawn or deleted quote's row is recomputed).
		quote_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		// Minor units with the four decimals MariaDB's division gives (part-price-key.ts).
		price_key: { type: DataTypes.DECIMAL(30, 4), allowNull: false }
	});
	await qi.addIndex(
		'part_region_prices',
		['region_id', 'category', 'price_key', 'brand', 'model', 'part_id'],
		{ name: 'part_region_prices_region_category_key' }
	);
	await qi.addIndex('part_region_prices', ['region_id', 'price_key', 'brand', 'model', 'part_id'], {
		name: 'part_region_prices_region_key'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('part_region_prices');
};
