import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser } from './columns.js';

// In-app notices under the bell (docs/architecture.md "Notice"). CASCADE: a user's notices go with the account.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('notices', {
		id: idColumn,
		user_id: referencesUser('CASCADE', false),
		kind: { type: DataTypes.STRING(24), allowNull: false },
		message: { type: DataTypes.STRING(300), allowNull: false },
		// A same-site path ("/guides/…"), never a full URL.
		link_path: { type: DataTypes.STRING(300), allowNull: false },
		read_at: { type: DataTypes.DATE, allowNull: true },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('notices', ['user_id', 'created_at']);
	await qi.addIndex('notices', ['user_id', 'read_at']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('notices');
};
