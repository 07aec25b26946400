import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'disabled_at', { type: DataTypes.DATE, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'disabled_at');
};
