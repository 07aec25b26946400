import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// An optional https link to the author's external build walkthrough.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guides', 'walkthrough_url', { type: DataTypes.STRING(500), allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guides', 'walkthrough_url');
};
