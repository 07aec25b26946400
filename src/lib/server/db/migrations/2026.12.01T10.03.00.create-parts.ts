import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('parts', {
		id: idColumn,
		category: { type: DataTypes.STRING(16), allowNull: false },
		brand: { type: DataTypes.STRING(80), allowNull: false },
		model: { type: DataTypes.STRING(120), allowNull: false },
		slug: { type: DataTypes.STRING(140), allowNull: false, unique: true },
		specs: { type: DataTypes.JSON, allowNull: false },
		...timestamps
	});
	await qi.addIndex('parts', ['category'], { name: 'parts_category' });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('parts');
};
