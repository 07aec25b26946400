import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { references } from './columns.js';

/*
 * What a published revision looked like when it went live, for upkeep alerts
 * (services/upkeep-alerts.ts): its priced total per region and the fit findings of its
 * picks. guide_region_prices is replaced on every recomputation, so "moved since
 * publication" and "a rule added since publication now flags it" need this first picture,
 * written once, the first time the revision is priced after approval, and never updated.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guide_upkeep_baselines', {
		revision_id: { ...references('guide_revisions', 'CASCADE'), primaryKey: true },
		// { "<regionId>": { "currency": "EUR", "totalMinor": 123400 | null } }
		totals: { type: DataTypes.JSON, allowNull: false },
		// Identities ("rule|slotKey,slotKey") of the picks' findings at publication.
		finding_keys: { type: DataTypes.JSON, allowNull: false },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_upkeep_baselines');
};
