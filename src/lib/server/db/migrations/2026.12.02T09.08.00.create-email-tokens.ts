import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser } from './columns.js';

// Single-use tokens sent by e-mail (address verification, password reset). Only the
// sha256 of a token is stored, so a database leak does not hand out working links.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('email_tokens', {
		id: idColumn,
		user_id: referencesUser('CASCADE', false),
		purpose: { type: DataTypes.STRING(20), allowNull: false },
		token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
		expires_at: { type: DataTypes.DATE, allowNull: false },
		used_at: { type: DataTypes.DATE, allowNull: true },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('email_tokens');
};
