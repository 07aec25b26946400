import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

/*
 * Periodic jobs (server/schedule): one row per job and period ('upkeep-staleness' and a
 * UTC day, 'upkeep-digest' and an ISO week). The process that inserts the row runs the job;
 * finished_at marks it done, and a row left unfinished past its lease by a process that died
 * may be taken over.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('scheduled_runs', {
		job: { type: DataTypes.STRING(40), allowNull: false, primaryKey: true },
		period: { type: DataTypes.STRING(16), allowNull: false, primaryKey: true },
		started_at: { type: DataTypes.DATE, allowNull: false },
		finished_at: { type: DataTypes.DATE, allowNull: true }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('scheduled_runs');
};
