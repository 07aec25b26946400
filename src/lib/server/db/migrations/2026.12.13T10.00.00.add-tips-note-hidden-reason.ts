import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

/*
 * A tip's public note is content like a guide or a build: readers report it and editors hide
 * it with a reason the supporter sees (issue 20, "Moderation and abuse"). note_hidden_at
 * exists since the tips table; the reason and who hid it join it here, as on guides.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('tips', 'note_hidden_reason', { type: DataTypes.TEXT, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'tips', 'note_hidden_reason');
};
