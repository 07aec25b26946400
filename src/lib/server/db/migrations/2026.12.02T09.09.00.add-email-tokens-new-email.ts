import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// An e-mail change is confirmed from the new address: the token carries where to move.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('email_tokens', 'new_email', { type: DataTypes.STRING(254), allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'email_tokens', 'new_email');
};
