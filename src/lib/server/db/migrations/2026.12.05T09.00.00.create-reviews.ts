import { DataTypes, QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn, idColumn, references, referencesUser } from './columns.js';

/*
 * The moderation log: one row per editor decision on a guide (approve, request changes,
 * decline on a revision; unpublish or archive on the guide). Rows are never edited.
 * guide_revisions.decision copies the revision's outcome so lists need no join.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('reviews', {
		id: idColumn,
		guide_id: references('guides', 'CASCADE'),
		// NULL for guide-level decisions (unpublish, archive).
		revision_id: references('guide_revisions', 'CASCADE', true),
		// SET NULL: the decision stands if the editor's account is deleted.
		reviewer_id: referencesUser('SET NULL'),
		decision: { type: DataTypes.STRING(20), allowNull: false },
		note: { type: DataTypes.TEXT, allowNull: true },
		slot_notes: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
		self_review_override: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('reviews', ['guide_id', 'created_at']);
	await qi.addIndex('reviews', ['revision_id']);
	await qi.addColumn('guide_revisions', 'decision', {
		type: DataTypes.STRING(20),
		allowNull: true
	});
	await qi.addIndex('guide_revisions', ['submitted_at', 'reviewed_at'], {
		name: 'guide_revisions_review_queue'
	});
};

export const down: Migration = async ({ context: qi }) => {
	// Raw statements: the driver rejects Sequelize's untyped removeIndex/removeColumn (see columns.ts).
	await qi.sequelize.query('DROP INDEX `guide_revisions_review_queue` ON `guide_revisions`', {
		type: QueryTypes.RAW
	});
	await dropColumn(qi, 'guide_revisions', 'decision');
	await qi.dropTable('reviews');
};
