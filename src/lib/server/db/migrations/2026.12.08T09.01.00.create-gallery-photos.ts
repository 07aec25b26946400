import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

/*
 * A guide revision's gallery (docs/architecture.md "Gallery", GalleryPhoto): which photos,
 * in which assembly stage and order, with caption and alt text. Rows belong to a revision
 * like its slots, so a photo added to a draft is public only once that revision is approved,
 * and the next revision starts with a copy.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('gallery_photos', {
		id: idColumn,
		revision_id: references('guide_revisions', 'CASCADE'),
		photo_id: references('photos', 'CASCADE'),
		stage: { type: DataTypes.STRING(24), allowNull: false },
		position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
		alt_text: { type: DataTypes.STRING(300), allowNull: false },
		...timestamps
	});
	await qi.addIndex('gallery_photos', ['revision_id', 'photo_id'], { unique: true });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('gallery_photos');
};
