import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

/*
 * The editor who hid the build. No foreign key on purpose, as for guides.hidden_by_id: the
 * audit trail is the lasting record of who did it, and a plain column drops cleanly in
 * `down`. A deleted editor's id simply finds no user.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('builds', 'hidden_by_id', { type: DataTypes.UUID, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'builds', 'hidden_by_id');
};
