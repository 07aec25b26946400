import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// When an editor hid the build after a content report; NULL while it is visible.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('builds', 'hidden_at', { type: DataTypes.DATE, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'builds', 'hidden_at');
};
