import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guides', {
		id: idColumn,
		slug: { type: DataTypes.STRING(140), allowNull: false, unique: true },
		// SET NULL: a deleted account's published guides stay, shown as "former member".
		author_id: referencesUser('SET NULL'),
		title: { type: DataTypes.STRING(160), allowNull: false },
		summary: { type: DataTypes.TEXT, allowNull: false },
		target_budget_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		base_region_id: references('regions', 'RESTRICT'),
		tags: { type: DataTypes.JSON, allowNull: false },
		featured: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		state: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'draft' },
		// The FK to guide_revisions is added once that table exists (next migrations).
		published_revision_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
		version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
		...timestamps
	});
	await qi.addIndex('guides', ['state'], { name: 'guides_state' });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guides');
};
