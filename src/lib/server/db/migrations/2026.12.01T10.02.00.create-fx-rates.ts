import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'fx_rates',
		{
			id: idColumn,
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			rate_per_eur: { type: DataTypes.DECIMAL(18, 6), allowNull: false },
			as_of: { type: DataTypes.DATEONLY, allowNull: false },
			source: { type: DataTypes.STRING(200), allowNull: false },
			...timestamps
		},
		{ uniqueKeys: { fx_rates_currency_as_of: { fields: ['currency', 'as_of'] } } }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('fx_rates');
};
