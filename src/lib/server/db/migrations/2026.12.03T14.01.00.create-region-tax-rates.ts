import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser } from './columns.js';

/*
 * Tax rates with the date each takes effect (VAT rates move: FI 25.5 % from Sep 2024,
 * SK 23 % from Jan 2025...). The rate in force on a day is the row with the latest
 * effective_from on or before it. regions.tax_rate_bp stays as a cache of the rate in
 * force today (services/regions keeps it in step), so readers of regions need no join.
 * The unique key is part of the one CREATE TABLE, so this stays a single schema change.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'region_tax_rates',
		{
			id: idColumn,
			region_id: references('regions', 'CASCADE'),
			rate_bp: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			// A calendar date (the law's "from 1 January"), not an instant.
			effective_from: { type: DataTypes.DATEONLY, allowNull: false },
			note: { type: DataTypes.STRING(200), allowNull: true },
			// SET NULL: the history stays when the recording editor's account is deleted.
			created_by_id: referencesUser('SET NULL'),
			created_at: { type: DataTypes.DATE, allowNull: false }
		},
		{
			uniqueKeys: {
				// customIndex: Sequelize only emits a UNIQUE clause for keys marked so.
				region_tax_rates_region_effective: {
					fields: ['region_id', 'effective_from'],
					customIndex: true
				}
			}
		}
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('region_tax_rates');
};
