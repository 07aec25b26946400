import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('quotes', {
		id: idColumn,
		part_id: references('parts', 'CASCADE'),
		store_id: references('stores', 'RESTRICT'),
		region_id: references('regions', 'RESTRICT'),
		amount_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		currency: { type: DataTypes.CHAR(3), allowNull: false },
		tax_included: { type: DataTypes.BOOLEAN, allowNull: false },
		shipping_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
		observed_at: { type: DataTypes.DATE, allowNull: false },
		url: { type: DataTypes.STRING(500), allowNull: true },
		source: { type: DataTypes.STRING(16), allowNull: false },
		status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' },
		...timestamps
	});
	await qi.addIndex('quotes', ['part_id', 'region_id', 'observed_at'], {
		name: 'quotes_part_region_observed'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('quotes');
};
