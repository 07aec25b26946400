import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { timestamps } from './columns.js';

// An author's tip settings: on or off, and the short thank-you shown after a tip. No row: on, no message.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('tip_settings', {
		user_id: {
			type: DataTypes.UUID,
			allowNull: false,
			primaryKey: true,
			references: { model: 'users', key: 'id' },
			onDelete: 'CASCADE',
			onUpdate: 'CASCADE'
		},
		tips_enabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		thank_you_message: { type: DataTypes.STRING(280), allowNull: false, defaultValue: '' },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('tip_settings');
};
