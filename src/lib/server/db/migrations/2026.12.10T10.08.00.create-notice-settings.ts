import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { referencesUser } from './columns.js';

// Per user and notice kind: in-app and e-mail on or off. No row means the kind's default.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('notice_settings', {
		user_id: { ...referencesUser('CASCADE', false), primaryKey: true },
		kind: { type: DataTypes.STRING(24), allowNull: false, primaryKey: true },
		in_app: { type: DataTypes.BOOLEAN, allowNull: false },
		email: { type: DataTypes.BOOLEAN, allowNull: false },
		updated_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('notice_settings');
};
