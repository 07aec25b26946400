import { DataTypes, Model } from 'sequelize';
import type { ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize';
import type { Tip } from './Tip.js';

export type PaymentEventOutcome = 'applied' | 'unchanged' | 'unknown' | 'ignored';

/** A provider event the webhook accepted; its id as primary key makes a redelivery a no-op. */
export class PaymentEvent extends Model<
	InferAttributes<PaymentEvent>,
	InferCreationAttributes<PaymentEvent>
> {
	declare eventId: string;
	declare type: string;
	declare tipId: ForeignKey<Tip['id']> | null;
	declare outcome: PaymentEventOutcome;
	declare receivedAt: Date;
}

export function initPaymentEvent(sequelize: Sequelize) {
	PaymentEvent.init(
		{
			eventId: { type: DataTypes.STRING(255), allowNull: false, primaryKey: true },
			type: { type: DataTypes.STRING(64), allowNull: false },
			outcome: { type: DataTypes.STRING(16), allowNull: false },
			receivedAt: { type: DataTypes.DATE, allowNull: false }
		},
		{ sequelize, tableName: 'payment_events', underscored: true, timestamps: false }
	);
}
