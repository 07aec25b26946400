import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// The editor's reason for hiding the build, shown to its owner.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('builds', 'hidden_reason', { type: DataTypes.TEXT, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'builds', 'hidden_reason');
};
