import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * Mailings: one newsletter send about one approved revision (a new guide, or a revision
 * its author marked major). UNIQUE revision_id: a revision is mailed at most once.
 * Subject, intro and filters are the editor's; link_origin is the site address the links
 * in every message start with, fixed when the mailing starts.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('mailings', {
		id: idColumn,
		guide_id: references('guides', 'CASCADE'),
		revision_id: { ...references('guide_revisions', 'CASCADE'), unique: true },
		created_by_id: referencesUser('SET NULL'),
		status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'draft' },
		subject: { type: DataTypes.STRING(150), allowNull: false },
		intro: { type: DataTypes.TEXT, allowNull: false },
		// { regions: string[], tags: string[], followers: boolean }
		filters: { type: DataTypes.JSON, allowNull: false },
		link_origin: { type: DataTypes.STRING(200), allowNull: true },
		recipients: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
		test_sent_at: { type: DataTypes.DATE, allowNull: true },
		started_at: { type: DataTypes.DATE, allowNull: true },
		finished_at: { type: DataTypes.DATE, allowNull: true },
		// Counts per outcome once every job is settled.
		summary: { type: DataTypes.JSON, allowNull: true },
		...timestamps
	});
	await qi.addIndex('mailings', ['status', 'created_at']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('mailings');
};
