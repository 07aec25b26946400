import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * Prices seen by the community, waiting for an editor. One row per part, store, region,
 * amount and UTC day while pending: later reports of the same price are merged into it
 * (price_sighting_reports lists who saw it). A verified row points at the Quote it became.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('price_sightings', {
		id: idColumn,
		part_id: references('parts', 'CASCADE'),
		store_id: references('stores', 'RESTRICT'),
		region_id: references('regions', 'RESTRICT'),
		amount_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		currency: { type: DataTypes.CHAR(3), allowNull: false },
		// The UTC day the price was seen: duplicates are merged per day, not per instant.
		observed_on: { type: DataTypes.DATEONLY, allowNull: false },
		url: { type: DataTypes.STRING(500), allowNull: false },
		// SET NULL: the sighting stands if the first reporter's account is deleted.
		submitted_by_id: referencesUser('SET NULL'),
		seen_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
		state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
		decided_by_id: referencesUser('SET NULL'),
		decided_at: { type: DataTypes.DATE, allowNull: true },
		reject_reason: { type: DataTypes.STRING(500), allowNull: true },
		quote_id: references('quotes', 'SET NULL', true),
		...timestamps
	});
	await qi.addIndex('price_sightings', ['part_id', 'store_id', 'observed_on', 'amount_minor'], {
		name: 'price_sightings_same_price'
	});
	await qi.addIndex('price_sightings', ['state', 'created_at'], {
		name: 'price_sightings_state_created'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('price_sightings');
};
