import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { PartCategory } from '../../../domain/types.js';
import type { Build } from './Build.js';
import type { Part } from './Part.js';

export const BUILD_SLOT_ORIGINS = ['source', 'alternate', 'custom'] as const;
export type BuildSlotOrigin = (typeof BUILD_SLOT_ORIGINS)[number];

/**
 * One slot of a build: the part the reader plans to buy, an optional price they saw
 * (override), and the purchase tracker. `sourceSlotKey` is the slot key (guide_slots.slot_key)
 * of the source slot it came from, stable across revisions; null for slots the reader added.
 * Money columns carry their currency: the build's region may change after they were entered.
 */
export class BuildSlot extends Model<
	InferAttributes<BuildSlot>,
	InferCreationAttributes<BuildSlot>
> {
	declare id: CreationOptional<number>;
	declare buildId: ForeignKey<Build['id']>;
	declare sourceSlotKey: string | null;
	declare category: PartCategory;
	declare label: string;
	declare position: number;
	declare partId: ForeignKey<Part['id']>;
	declare quantity: CreationOptional<number>;
	declare origin: BuildSlotOrigin;
	declare priceOverrideMinor: CreationOptional<number | null>;
	declare priceOverrideCurrency: CreationOptional<string | null>;
	declare priceOverrideStore: CreationOptional<string | null>;
	/** YYYY-MM-DD. */
	declare priceOverrideDate: CreationOptional<string | null>;
	declare purchased: CreationOptional<boolean>;
	declare paidMinor: CreationOptional<number | null>;
	declare paidCurrency: CreationOptional<string | null>;
	/** YYYY-MM-DD. */
	declare purchasedAt: CreationOptional<string | null>;
	declare purchaseStore: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initBuildSlot(sequelize: Sequelize) {
	BuildSlot.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			sourceSlotKey: { type: DataTypes.STRING(80), allowNull: true },
			category: { type: DataTypes.STRING(16), allowNull: false },
			label: { type: DataTypes.STRING(80), allowNull: false },
			position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			quantity: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			origin: { type: DataTypes.STRING(10), allowNull: false },
			priceOverrideMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			priceOverrideCurrency: { type: DataTypes.CHAR(3), allowNull: true },
			priceOverrideStore: { type: DataTypes.STRING(120), allowNull: true },
			priceOverrideDate: { type: DataTypes.DATEONLY, allowNull: true },
			purchased: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			paidMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			paidCurrency: { type: DataTypes.CHAR(3), allowNull: true },
			purchasedAt: { type: DataTypes.DATEONLY, allowNull: true },
			purchaseStore: { type: DataTypes.STRING(120), allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'build_slots', underscored: true }
	);
}
