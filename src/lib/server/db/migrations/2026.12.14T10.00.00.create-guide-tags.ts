import { DataTypes, QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { references } from './columns.js';

/*
 * Each guide's tags as rows (guides.tags stays the JSON copy pages read), so the browse
 * form's list of tags in use is an indexed query over the few distinct tags rather than a
 * scan of every published guide's JSON (issue 14). Kept by the Guide model's afterSave
 * hook; filled here for the guides that exist.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guide_tags', {
		tag: { type: DataTypes.STRING(64), allowNull: false, primaryKey: true },
		guide_id: { ...references('guides', 'CASCADE'), primaryKey: true }
	});
	await qi.addIndex('guide_tags', ['guide_id'], { name: 'guide_tags_guide' });
	await qi.sequelize.query(
		`INSERT IGNORE INTO guide_tags (tag, guide_id)
		 SELECT t.tag, g.id FROM guides g,
		        JSON_TABLE(g.tags, '$[*]' COLUMNS (tag VARCHAR(64) PATH '$')) t
		  WHERE t.tag IS NOT NULL`,
		{ type: QueryTypes.INSERT }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_tags');
};
