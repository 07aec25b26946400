import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

/*
 * When the author last turned the weekly upkeep digest on: their first digest lists only
 * alerts seen since then (the older ones were on the dashboard where they turned it on).
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('users', 'upkeep_digest_since', { type: DataTypes.DATE, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'users', 'upkeep_digest_since');
};
