import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references } from './columns.js';

/*
 * Upkeep alerts of published guides (services/upkeep-alerts.ts), recomputed when quotes,
 * sightings or rates change. One row per condition that holds now, identified by its
 * fingerprint (kind, region, slot and what it is about), so recomputation keeps when it was
 * first seen and the author's snooze or "handled" mark; a condition that stops holding
 * loses its row.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guide_upkeep_alerts', {
		id: idColumn,
		guide_id: references('guides', 'CASCADE'),
		revision_id: references('guide_revisions', 'CASCADE'),
		fingerprint: { type: DataTypes.STRING(191), allowNull: false },
		kind: { type: DataTypes.STRING(32), allowNull: false },
		region_id: references('regions', 'CASCADE', true),
		slot_key: { type: DataTypes.STRING(64), allowNull: true },
		severity: { type: DataTypes.STRING(16), allowNull: false },
		details: { type: DataTypes.JSON, allowNull: false },
		first_seen_at: { type: DataTypes.DATE, allowNull: false },
		last_seen_at: { type: DataTypes.DATE, allowNull: false },
		snoozed_until: { type: DataTypes.DATE, allowNull: true },
		handled_at: { type: DataTypes.DATE, allowNull: true }
	});
	await qi.addIndex('guide_upkeep_alerts', ['guide_id', 'fingerprint'], {
		name: 'guide_upkeep_alerts_guide_fingerprint',
		unique: true
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_upkeep_alerts');
};
