import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { references } from './columns.js';

/*
 * Priced totals, ranges and value of each published revision in each region, stored when a
 * revision is published, a quote is accepted or the rates change (services/guide-prices.ts),
 * so browse, home and the guide list read one indexed query per page instead of pricing
 * every guide on every request. Keyed on the revision: a revision is immutable once
 * published, so a row is only ever replaced by recomputation, never patched.
 *
 * The sort keys are NOT NULL copies of the total and value with "no figure" mapped to the
 * end of the order, so ORDER BY walks the (region, key) indexes instead of sorting.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guide_region_prices', {
		revision_id: { ...references('guide_revisions', 'CASCADE'), primaryKey: true },
		region_id: { ...references('regions', 'CASCADE'), primaryKey: true },
		guide_id: references('guides', 'CASCADE'),
		// 1 for the row in the guide's own base region (lists without a chosen region).
		is_base: { type: DataTypes.BOOLEAN, allowNull: false },
		currency: { type: DataTypes.CHAR(3), allowNull: false },
		picks_total_minor: { type: DataTypes.BIGINT, allowNull: true },
		unpriced_slots: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		range_min_minor: { type: DataTypes.BIGINT, allowNull: true },
		range_max_minor: { type: DataTypes.BIGINT, allowNull: true },
		fps_per_100: { type: DataTypes.DOUBLE, allowNull: true },
		// Lowest total first, no total last (9e18 sorts after every real amount).
		total_sort: { type: DataTypes.BIGINT, allowNull: false },
		// Highest value first, no value last (-1 sorts after every real value).
		value_sort: { type: DataTypes.DOUBLE, allowNull: false },
		published_at: { type: DataTypes.DATE, allowNull: false },
		computed_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('guide_region_prices', ['is_base', 'published_at'], {
		name: 'guide_region_prices_base_newest'
	});
	await qi.addIndex('guide_region_prices', ['region_id', 'published_at'], {
		name: 'guide_region_prices_region_newest'
	});
	await qi.addIndex('guide_region_prices', ['region_id', 'total_sort', 'published_at'], {
		name: 'guide_region_prices_region_total'
	});
	await qi.addIndex('guide_region_prices', ['region_id', 'value_sort', 'published_at'], {
		name: 'guide_region_prices_region_value'
	});
	await qi.addIndex('guide_region_prices', ['guide_id'], { name: 'guide_region_prices_guide' });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_region_prices');
};
