import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// Every guide says whether it is sponsored or carries affiliate links; existing ones had none.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guides', 'disclosure', {
		type: DataTypes.STRING(16),
		allowNull: false,
		defaultValue: 'none'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guides', 'disclosure');
};
