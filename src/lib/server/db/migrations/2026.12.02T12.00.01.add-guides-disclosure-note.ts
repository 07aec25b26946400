import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// Which parts were sponsored or which links earn a commission, in the author's words.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guides', 'disclosure_note', { type: DataTypes.TEXT, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guides', 'disclosure_note');
};
