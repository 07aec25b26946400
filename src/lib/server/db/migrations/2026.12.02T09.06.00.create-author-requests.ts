import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('author_requests', {
		id: idColumn,
		// CASCADE: a request means nothing once its account is gone.
		user_id: referencesUser('CASCADE', false),
		pitch: { type: DataTypes.TEXT, allowNull: false },
		state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
		// SET NULL: the decision stands even if the deciding editor's account is deleted.
		decided_by_id: referencesUser('SET NULL'),
		decision_note: { type: DataTypes.TEXT, allowNull: true },
		decided_at: { type: DataTypes.DATE, allowNull: true },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('author_requests');
};
