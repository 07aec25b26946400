import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// The author page's address (/authors/[handle]); filled for existing accounts by the next
// migrations but one, then made required and unique.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'handle', { type: DataTypes.STRING(30), allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'handle');
};
