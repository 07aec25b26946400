import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'guide_revisions',
		{
			id: idColumn,
			guide_id: references('guides', 'CASCADE'),
			number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			build_notes_md: { type: DataTypes.TEXT('medium'), allowNull: false },
			build_notes_html: { type: DataTypes.TEXT('medium'), allowNull: true },
			submitted_at: { type: DataTypes.DATE, allowNull: true },
			reviewed_at: { type: DataTypes.DATE, allowNull: true },
			published_at: { type: DataTypes.DATE, allowNull: true },
			reviewer_id: referencesUser('SET NULL'),
			review_note: { type: DataTypes.TEXT, allowNull: true },
			...timestamps
		},
		{ uniqueKeys: { guide_revisions_guide_number: { fields: ['guide_id', 'number'] } } }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_revisions');
};
