import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * Builds: a reader's fork of a guide revision (docs/architecture.md "Build", "Drift", "Sync").
 * build_slots keep the source slot's key (its label in the source revision) so drift and
 * sync can match slots across revisions; build_syncs keep what a sync replaced, for undo.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('builds', {
		id: idColumn,
		// CASCADE: a build is private working data of its owner.
		owner_id: referencesUser('CASCADE', false),
		// SET NULL: the build survives if its source is ever removed; it just loses the link.
		source_guide_id: references('guides', 'SET NULL', true),
		base_revision_id: references('guide_revisions', 'SET NULL', true),
		title: { type: DataTypes.STRING(160), allowNull: false },
		region_id: references('regions', 'RESTRICT'),
		visibility: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'private' },
		// The unguessable part of an unlisted build's link.
		share_token: { type: DataTypes.STRING(43), allowNull: false, unique: true },
		notes: { type: DataTypes.TEXT, allowNull: false },
		budget_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
		notify_on_new_revision: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		last_notified_revision_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
		version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
		...timestamps
	});
	await qi.addIndex('builds', ['owner_id', 'updated_at']);
	await qi.addIndex('builds', ['source_guide_id', 'visibility']);

	await qi.createTable('build_slots', {
		id: idColumn,
		build_id: references('builds', 'CASCADE'),
		// The source slot's key (its label in the source revision); NULL for slots the reader added.
		source_slot_key: { type: DataTypes.STRING(80), allowNull: true },
		category: { type: DataTypes.STRING(16), allowNull: false },
		label: { type: DataTypes.STRING(80), allowNull: false },
		position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		part_id: references('parts', 'RESTRICT'),
		quantity: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
		// source: the author's pick; alternate: one of the slot's alternates; custom: any catalog part.
		origin: { type: DataTypes.STRING(10), allowNull: false },
		price_override_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
		price_override_currency: { type: DataTypes.CHAR(3), allowNull: true },
		price_override_store: { type: DataTypes.STRING(120), allowNull: true },
		price_override_date: { type: DataTypes.DATEONLY, allowNull: true },
		purchased: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		paid_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
		paid_currency: { type: DataTypes.CHAR(3), allowNull: true },
		purchased_at: { type: DataTypes.DATEONLY, allowNull: true },
		purchase_store: { type: DataTypes.STRING(120), allowNull: true },
		...timestamps
	});
	await qi.addIndex('build_slots', ['build_id', 'position']);

	await qi.createTable('build_syncs', {
		id: idColumn,
		build_id: references('builds', 'CASCADE'),
		from_revision_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
		to_revision_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		// The build's slots as they were before the sync (JSON rows), restored by undo.
		slots_before: { type: DataTypes.JSON, allowNull: false },
		undone_at: { type: DataTypes.DATE, allowNull: true },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.addIndex('build_syncs', ['build_id', 'created_at']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('build_syncs');
	await qi.dropTable('build_slots');
	await qi.dropTable('builds');
};
