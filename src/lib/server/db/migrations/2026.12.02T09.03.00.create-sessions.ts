import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { referencesUser } from './columns.js';

// Auth.js adapter table. Slotwise uses JWT sessions, so it stays empty; the adapter's
// contract still expects it.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('sessions', {
		id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
		expires: { type: DataTypes.DATE, allowNull: false },
		session_token: { type: DataTypes.STRING(255), allowNull: false, unique: true },
		user_id: referencesUser('CASCADE', false)
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('sessions');
};
