import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('stores', {
		id: idColumn,
		name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
		region_id: references('regions', 'RESTRICT'),
		url: { type: DataTypes.STRING(500), allowNull: false },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('stores');
};
