import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * The tip ledger (issue 20): one row per checkout session, so one payment can never be two
 * rows; amounts are integer minor units with their ISO 4217 code, the provider's fee too.
 * Status only moves forward (pending → failed → paid → refunded; see domain/tips.ts), so
 * webhooks that arrive twice or out of order cannot count a payment twice.
 * SET NULL on people, guide and build: a payment that happened stays in the books.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('tips', {
		id: idColumn,
		supporter_id: referencesUser('SET NULL', true),
		author_id: referencesUser('SET NULL', true),
		guide_id: references('guides', 'SET NULL', true),
		build_id: references('builds', 'SET NULL', true),
		amount_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		currency: { type: DataTypes.CHAR(3), allowNull: false },
		// The provider's fee in the same currency, known once the payment succeeded.
		fee_minor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
		status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' },
		checkout_session_id: { type: DataTypes.STRING(255), allowNull: false, unique: true },
		payment_intent_id: { type: DataTypes.STRING(255), allowNull: true, unique: true },
		note: { type: DataTypes.STRING(280), allowNull: true },
		anonymous: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		note_hidden_at: { type: DataTypes.DATE, allowNull: true },
		paid_at: { type: DataTypes.DATE, allowNull: true },
		failed_at: { type: DataTypes.DATE, allowNull: true },
		refunded_at: { type: DataTypes.DATE, allowNull: true },
		...timestamps
	});
	await qi.addIndex('tips', ['author_id', 'status', 'paid_at']);
	await qi.addIndex('tips', ['supporter_id', 'created_at']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('tips');
};
