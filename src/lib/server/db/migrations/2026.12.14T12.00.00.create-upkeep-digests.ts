import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser } from './columns.js';

/*
 * The weekly upkeep digests decided so far (services/upkeep-digest.ts): one row per author
 * and ISO week, written in the same transaction as the queued e-mail (or with no e-mail when
 * nothing was new), so a second scheduler run in the same week finds the row and sends nothing.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('upkeep_digests', {
		id: idColumn,
		author_id: referencesUser('CASCADE', false),
		iso_week: { type: DataTypes.STRING(8), allowNull: false },
		alert_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		mail_job_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('upkeep_digests', ['author_id', 'iso_week'], {
		name: 'upkeep_digests_author_week',
		unique: true
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('upkeep_digests');
};
