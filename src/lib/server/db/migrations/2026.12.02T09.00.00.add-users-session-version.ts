import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// Bumped on password change, sign-out everywhere, role change and disable: a JWT carrying
// an older number is refused on its next request.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'session_version', {
		type: DataTypes.INTEGER.UNSIGNED,
		allowNull: false,
		defaultValue: 1
	});
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'session_version');
};
