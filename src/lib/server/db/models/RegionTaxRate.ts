import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Region } from './Region.js';
import type { User } from './User.js';

/**
 * A region's tax rate from a calendar date on (basis points: 1900 = 19 %). The rate in
 * force on a day is the row with the latest effectiveFrom on or before that day.
 * Rows are added or removed, never edited, so the history reads as it was recorded.
 */
export class RegionTaxRate extends Model<
	InferAttributes<RegionTaxRate>,
	InferCreationAttributes<RegionTaxRate>
> {
	declare id: CreationOptional<number>;
	declare regionId: ForeignKey<Region['id']>;
	declare rateBp: number;
	/** 'YYYY-MM-DD' (DATEONLY comes back as a string, never shifted by a time zone). */
	declare effectiveFrom: string;
	declare note: string | null;
	declare createdById: ForeignKey<User['id']> | null;
	declare createdAt: CreationOptional<Date>;
}

export function initRegionTaxRate(sequelize: Sequelize) {
	RegionTaxRate.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			rateBp: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			effectiveFrom: { type: DataTypes.DATEONLY, allowNull: false },
			note: { type: DataTypes.STRING(200), allowNull: true },
			createdAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'region_tax_rates', underscored: true, updatedAt: false }
	);
}
