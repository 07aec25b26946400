import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'slot_alternates',
		{
			id: idColumn,
			slot_id: references('guide_slots', 'CASCADE'),
			part_id: references('parts', 'RESTRICT'),
			rank: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			reason_tag: { type: DataTypes.STRING(20), allowNull: false },
			note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
			...timestamps
		},
		{ uniqueKeys: { slot_alternates_slot_rank: { fields: ['slot_id', 'rank'] } } }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('slot_alternates');
};
