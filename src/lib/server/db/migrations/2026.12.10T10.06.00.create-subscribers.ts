import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * Newsletter subscribers (docs/architecture.md "Mailing"). One row per address, whatever
 * happens to it: pending until the double opt-in link is followed, then confirmed;
 * unsubscribed or suppressed (the mail server refused the address for good) later. Only the
 * SHA-256 of the confirmation link's token is kept; manage and unsubscribe links are signed
 * and carry link_version, which is bumped to revoke every link sent so far.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('subscribers', {
		id: idColumn,
		email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
		// SET NULL: the subscription belongs to the address and outlives the account.
		user_id: { ...referencesUser('SET NULL'), unique: true },
		status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'pending' },
		// Prices in mailings are shown in this region.
		home_region_id: references('regions', 'RESTRICT'),
		// Region codes of the guides wanted, as JSON; [] means every region.
		regions: { type: DataTypes.JSON, allowNull: false },
		// In the home region's currency, minor units; NULL means no bound.
		budget_min_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
		budget_max_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
		tags: { type: DataTypes.JSON, allowNull: false },
		// filters, follows (new guides from followed authors only) or both (either one).
		audience: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'filters' },
		confirm_token_hash: { type: DataTypes.CHAR(64), allowNull: true },
		confirm_sent_at: { type: DataTypes.DATE, allowNull: true },
		link_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
		confirmed_at: { type: DataTypes.DATE, allowNull: true },
		unsubscribed_at: { type: DataTypes.DATE, allowNull: true },
		suppressed_at: { type: DataTypes.DATE, allowNull: true },
		suppressed_reason: { type: DataTypes.STRING(200), allowNull: true },
		...timestamps
	});
	await qi.addIndex('subscribers', ['status']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('subscribers');
};
