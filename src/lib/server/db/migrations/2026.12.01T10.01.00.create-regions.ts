import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('regions', {
		id: idColumn,
		code: { type: DataTypes.STRING(8), allowNull: false, unique: true },
		name: { type: DataTypes.STRING(80), allowNull: false },
		currency: { type: DataTypes.CHAR(3), allowNull: false },
		tax_mode: { type: DataTypes.STRING(16), allowNull: false },
		tax_rate_bp: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
		category_factors_bp: { type: DataTypes.JSON, allowNull: false },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('regions');
};
