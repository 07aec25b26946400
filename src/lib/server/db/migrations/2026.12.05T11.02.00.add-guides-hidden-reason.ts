import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// The editor's reason for hiding the guide, shown to its author.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guides', 'hidden_reason', { type: DataTypes.TEXT, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guides', 'hidden_reason');
};
