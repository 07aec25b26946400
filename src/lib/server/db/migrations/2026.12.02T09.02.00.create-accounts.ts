import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { referencesUser } from './columns.js';

// Auth.js adapter table (linked sign-in providers). Created here, never by the adapter's
// lazy sync, which races on foreign keys.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'accounts',
		{
			id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
			type: { type: DataTypes.STRING(40), allowNull: false },
			provider: { type: DataTypes.STRING(80), allowNull: false },
			provider_account_id: { type: DataTypes.STRING(255), allowNull: false },
			refresh_token: { type: DataTypes.TEXT, allowNull: true },
			access_token: { type: DataTypes.TEXT, allowNull: true },
			expires_at: { type: DataTypes.INTEGER, allowNull: true },
			token_type: { type: DataTypes.STRING(40), allowNull: true },
			scope: { type: DataTypes.STRING(255), allowNull: true },
			id_token: { type: DataTypes.TEXT, allowNull: true },
			session_state: { type: DataTypes.STRING(255), allowNull: true },
			user_id: referencesUser('CASCADE', false)
		},
		{ uniqueKeys: { accounts_provider_account: { fields: ['provider', 'provider_account_id'] } } }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('accounts');
};
