import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { TipStatus } from '../../../domain/tips.js';
import type { Build } from './Build.js';
import type { Guide } from './Guide.js';
import type { User } from './User.js';
import { GUIDE_EXTRAS } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/**
 * One row of the tip ledger: one checkout session at the payment provider, its amount in
 * integer minor units, the provider's fee once paid, and a status that only moves forward.
 */
export class Tip extends Model<InferAttributes<Tip>, InferCreationAttributes<Tip>> {
	declare id: CreationOptional<number>;
	declare supporterId: ForeignKey<User['id']> | null;
	declare authorId: ForeignKey<User['id']> | null;
	declare guideId: ForeignKey<Guide['id']> | null;
	declare buildId: ForeignKey<Build['id']> | null;
	declare amountMinor: number;
	declare currency: string;
	declare feeMinor: CreationOptional<number | null>;
	declare status: CreationOptional<TipStatus>;
	declare checkoutSessionId: string;
	declare paymentIntentId: CreationOptional<string | null>;
	declare note: string | null;
	declare anonymous: boolean;
	declare noteHiddenAt: CreationOptional<Date | null>;
	declare noteHiddenReason: CreationOptional<string | null>;
	declare paidAt: CreationOptional<Date | null>;
	declare failedAt: CreationOptional<Date | null>;
	declare refundedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initTip(sequelize: Sequelize) {
	Tip.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			amountMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			feeMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' },
			checkoutSessionId: { type: DataTypes.STRING(255), allowNull: false, unique: true },
			paymentIntentId: { type: DataTypes.STRING(255), allowNull: true, unique: true },
			note: { type: DataTypes.STRING(280), allowNull: true },
			anonymous: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			noteHiddenAt: { type: DataTypes.DATE, allowNull: true },
			noteHiddenReason: { type: DataTypes.TEXT, allowNull: true },
			paidAt: { type: DataTypes.DATE, allowNull: true },
			failedAt: { type: DataTypes.DATE, allowNull: true },
			refundedAt: { type: DataTypes.DATE, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'tips', underscored: true }
	);
	// Tip notes on the guide page (services/guide-page-extras.ts).
	bumpAfterWrites(Tip, sequelize, GUIDE_EXTRAS);
}
