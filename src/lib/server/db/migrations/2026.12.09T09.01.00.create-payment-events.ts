import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { references } from './columns.js';

/*
 * Every provider event the webhook accepted, keyed by the provider's event id: the primary
 * key is what makes a redelivered or replayed event a no-op (issue 20, "idempotently by
 * event id"). Written in the same transaction as the ledger change it caused.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('payment_events', {
		event_id: { type: DataTypes.STRING(255), allowNull: false, primaryKey: true },
		type: { type: DataTypes.STRING(64), allowNull: false },
		tip_id: references('tips', 'SET NULL', true),
		// applied | unchanged | unknown (no ledger row of ours) | ignored (a type we do not use)
		outcome: { type: DataTypes.STRING(16), allowNull: false },
		received_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('payment_events');
};
