import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { PriceSighting } from './PriceSighting.js';
import type { User } from './User.js';

/** One person's report of a price sighting (unique per sighting and person). */
export class PriceSightingReport extends Model<
	InferAttributes<PriceSightingReport>,
	InferCreationAttributes<PriceSightingReport>
> {
	declare id: CreationOptional<number>;
	declare sightingId: ForeignKey<PriceSighting['id']>;
	declare userId: ForeignKey<User['id']>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initPriceSightingReport(sequelize: Sequelize) {
	PriceSightingReport.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'price_sighting_reports', underscored: true }
	);
}
