import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { referencesUser } from './columns.js';

// A reader follows an author. CASCADE both ways: a follow means nothing once either account is gone.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('follows', {
		follower_id: { ...referencesUser('CASCADE', false), primaryKey: true },
		author_id: { ...referencesUser('CASCADE', false), primaryKey: true },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('follows', ['author_id', 'created_at']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('follows');
};
