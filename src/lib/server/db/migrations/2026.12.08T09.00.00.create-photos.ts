import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * Processed photos (docs/architecture.md "Photo"): one row per upload that passed the
 * pipeline, with the files' random key prefix, the original's size after orientation, the
 * stored bytes (for the owner's quota), a placeholder and the variants as JSON. A photo
 * belongs to exactly one guide, part or build; hidden_* is set when an editor hides it
 * after a report.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('photos', {
		id: idColumn,
		// SET NULL: a deleted account's photos stay with the guide or build they illustrate.
		owner_id: referencesUser('SET NULL', true),
		guide_id: references('guides', 'CASCADE', true),
		part_id: references('parts', 'CASCADE', true),
		build_id: references('builds', 'CASCADE', true),
		key_prefix: { type: DataTypes.STRING(40), allowNull: false, unique: true },
		width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		placeholder: { type: DataTypes.TEXT, allowNull: false },
		variants: { type: DataTypes.JSON, allowNull: false },
		caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
		alt_text: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
		hidden_at: { type: DataTypes.DATE, allowNull: true },
		hidden_reason: { type: DataTypes.STRING(500), allowNull: true },
		hidden_by_id: referencesUser('SET NULL', true),
		...timestamps
	});
	await qi.addIndex('photos', ['owner_id']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('photos');
};
