import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

/*
 * A build's assembly checklist ticks (docs/architecture.md "Assembly checklist"): one row
 * per stage its owner has ticked off, keyed by the stage's fixed key so an update from the
 * guide keeps the tick while the stage still exists.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('build_stage_ticks', {
		id: idColumn,
		build_id: references('builds', 'CASCADE'),
		stage: { type: DataTypes.STRING(24), allowNull: false },
		ticked_at: { type: DataTypes.DATE, allowNull: false },
		...timestamps
	});
	await qi.addIndex('build_stage_ticks', ['build_id', 'stage'], { unique: true });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('build_stage_ticks');
};
