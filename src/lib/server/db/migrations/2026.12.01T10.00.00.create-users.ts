import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('users', {
		id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
		email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
		name: { type: DataTypes.STRING(120), allowNull: true },
		password_hash: { type: DataTypes.STRING(255), allowNull: true },
		role: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'reader' },
		email_verified_at: { type: DataTypes.DATE, allowNull: true },
		image: { type: DataTypes.STRING(500), allowNull: true },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('users');
};
