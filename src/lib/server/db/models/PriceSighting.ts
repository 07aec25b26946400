import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Part } from './Part.js';
import type { Quote } from './Quote.js';
import type { Region } from './Region.js';
import type { Store } from './Store.js';
import type { User } from './User.js';

export const PRICE_SIGHTING_STATES = ['pending', 'verified', 'rejected'] as const;
export type PriceSightingState = (typeof PRICE_SIGHTING_STATES)[number];

/**
 * A shelf price someone in the community saw, in integer minor units of `currency`, until
 * an editor verifies it (it becomes a Quote) or rejects it with a reason. Reports of the
 * same part, store, region, amount and UTC day are merged into one row: `seenCount` people
 * saw it (see PriceSightingReport), `submittedById` is the first of them.
 */
export class PriceSighting extends Model<
	InferAttributes<PriceSighting>,
	InferCreationAttributes<PriceSighting>
> {
	declare id: CreationOptional<number>;
	declare partId: ForeignKey<Part['id']>;
	declare storeId: ForeignKey<Store['id']>;
	declare regionId: ForeignKey<Region['id']>;
	declare amountMinor: number;
	declare currency: string;
	/** YYYY-MM-DD, the UTC day. */
	declare observedOn: string;
	declare url: string;
	declare submittedById: ForeignKey<User['id']> | null;
	declare seenCount: CreationOptional<number>;
	declare state: CreationOptional<PriceSightingState>;
	declare decidedById: CreationOptional<ForeignKey<User['id']> | null>;
	declare decidedAt: CreationOptional<Date | null>;
	declare rejectReason: CreationOptional<string | null>;
	declare quoteId: CreationOptional<ForeignKey<Quote['id']> | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initPriceSighting(sequelize: Sequelize) {
	PriceSighting.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			amountMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			observedOn: { type: DataTypes.DATEONLY, allowNull: false },
			url: { type: DataTypes.STRING(500), allowNull: false },
			seenCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
			decidedAt: { type: DataTypes.DATE, allowNull: true },
			rejectReason: { type: DataTypes.STRING(500), allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'price_sightings', underscored: true }
	);
}
