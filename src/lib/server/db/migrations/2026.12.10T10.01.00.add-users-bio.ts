import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// A short plain-text bio for the author page (at most 600 characters, checked by the form).
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'bio', { type: DataTypes.STRING(600), allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'bio');
};
