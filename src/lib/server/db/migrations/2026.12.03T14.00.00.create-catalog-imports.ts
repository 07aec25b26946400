import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { referencesUser } from './columns.js';

/*
 * Validated CSV uploads waiting for the editor's confirmation. Kept in the database, not
 * in process memory, so the confirm request may reach another app instance than the
 * upload did. Rows are deleted on confirm or discard, and expired ones on the next upload.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('catalog_imports', {
		// A random UUID: the id travels through the page, so it must not be guessable.
		id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
		// CASCADE: an unconfirmed upload means nothing once its editor's account is gone.
		editor_id: referencesUser('CASCADE', false),
		file_name: { type: DataTypes.STRING(200), allowNull: false },
		row_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		// The validated rows (category, brand, model, slug, specs), never the raw file.
		payload: { type: DataTypes.JSON, allowNull: false },
		created_at: { type: DataTypes.DATE, allowNull: false },
		expires_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('catalog_imports');
};
