import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

/*
 * Prices an author typed into a revision's slots (issue 12, item 2). They are proposals,
 * never quotes: nothing public reads them. Approving the revision turns each into a Quote
 * (or reuses an identical one) in the same transaction and records it in quote_id.
 * One row per slot position of a revision; the part, store and region are the slot's pick
 * and the store the author named.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('guide_price_proposals', {
		id: idColumn,
		revision_id: references('guide_revisions', 'CASCADE'),
		position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
		part_id: references('parts', 'CASCADE'),
		store_id: references('stores', 'CASCADE'),
		region_id: references('regions', 'RESTRICT'),
		amount_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		currency: { type: DataTypes.CHAR(3), allowNull: false },
		tax_included: { type: DataTypes.BOOLEAN, allowNull: false },
		observed_at: { type: DataTypes.DATE, allowNull: false },
		quote_id: references('quotes', 'SET NULL', true),
		...timestamps
	});
	await qi.addIndex('guide_price_proposals', ['revision_id', 'position'], {
		name: 'guide_price_proposals_revision_position',
		unique: true
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('guide_price_proposals');
};
