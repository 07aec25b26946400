import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references } from './columns.js';

/*
 * A build owner's answer "not now" to an update from the guide (services/build-declines.ts):
 * which revision they were offered and declined, and when. Fork insights count declines
 * from these rows; taking an update is recorded in build_syncs.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('build_update_declines', {
		id: idColumn,
		build_id: references('builds', 'CASCADE'),
		revision_id: references('guide_revisions', 'CASCADE'),
		declined_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('build_update_declines', ['build_id', 'revision_id'], {
		name: 'build_update_declines_build_revision',
		unique: true
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('build_update_declines');
};
