import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

/*
 * The editor who hid the guide. No foreign key on purpose: the audit trail is the lasting
 * record of who did it, and a plain column drops cleanly in `down` (a constraint added with
 * the column would get a generated name). A deleted editor's id simply finds no user.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guides', 'hidden_by_id', { type: DataTypes.UUID, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guides', 'hidden_by_id');
};
