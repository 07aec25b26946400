import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

/*
 * How far (basis points of the published total) a guide's total may move in a region before
 * its author gets an upkeep alert; 1000 = 10 %, the default every author starts from.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'upkeep_move_threshold_bp', {
		type: DataTypes.INTEGER,
		allowNull: false,
		defaultValue: 1000
	});
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'upkeep_move_threshold_bp');
};
