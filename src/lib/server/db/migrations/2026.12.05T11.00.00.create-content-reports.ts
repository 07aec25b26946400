import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser, timestamps } from './columns.js';

/*
 * Reports from signed-in people about a guide, build or photo. `subject_id` is a string so
 * one column serves any subject's key. `open_marker` is 1 while the report is open and
 * NULL once decided: the unique index then allows one open report per reporter and subject
 * (a unique index ignores NULLs) while keeping any number of closed ones.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('content_reports', {
		id: idColumn,
		subject_type: { type: DataTypes.STRING(16), allowNull: false },
		subject_id: { type: DataTypes.STRING(64), allowNull: false },
		// CASCADE: a deleted account's reports go with it (the decision's audit events stay).
		reporter_id: referencesUser('CASCADE', false),
		category: { type: DataTypes.STRING(24), allowNull: false },
		detail: { type: DataTypes.TEXT, allowNull: false },
		state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'open' },
		open_marker: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true, defaultValue: 1 },
		decided_by_id: referencesUser('SET NULL'),
		decided_at: { type: DataTypes.DATE, allowNull: true },
		...timestamps
	});
	await qi.addIndex(
		'content_reports',
		['reporter_id', 'subject_type', 'subject_id', 'open_marker'],
		{
			name: 'content_reports_one_open_per_reporter',
			unique: true
		}
	);
	// The editors' queue reads by state, grouped by subject.
	await qi.addIndex('content_reports', ['state', 'subject_type', 'subject_id'], {
		name: 'content_reports_queue'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('content_reports');
};
