import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// Auth.js stores sign-in link tokens hashed (sha256 of token + secret); single use.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('verification_tokens', {
		token: { type: DataTypes.STRING(255), primaryKey: true, allowNull: false },
		identifier: { type: DataTypes.STRING(254), allowNull: false },
		expires: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('verification_tokens', ['identifier'], {
		name: 'verification_tokens_identifier'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('verification_tokens');
};
