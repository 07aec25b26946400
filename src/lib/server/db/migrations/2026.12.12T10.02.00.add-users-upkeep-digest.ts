import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

/* An author's choice to get the weekly upkeep digest by e-mail; off until they turn it on. */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'upkeep_digest', {
		type: DataTypes.BOOLEAN,
		allowNull: false,
		defaultValue: false
	});
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'upkeep_digest');
};
