import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guide_slots', {
		id: idColumn,
		revision_id: references('guide_revisions', 'CASCADE'),
		category: { type: DataTypes.STRING(16), allowNull: false },
		label: { type: DataTypes.STRING(80), allowNull: false },
		position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		quantity: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
		pick_part_id: references('parts', 'RESTRICT'),
		reason: { type: DataTypes.TEXT, allowNull: false },
		price_quote_id: references('quotes', 'SET NULL', true),
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_slots');
};
