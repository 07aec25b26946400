import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { PartCategory, TaxMode } from '../../../domain/types.js';

/**
 * A pricing market. Rates and factors are integers in basis points (1900 = 19 %,
 * 10400 = ×1.04) so no float ever touches money.
 */
export class Region extends Model<InferAttributes<Region>, InferCreationAttributes<Region>> {
	declare id: CreationOptional<number>;
	declare code: string;
	declare name: string;
	declare currency: string;
	declare taxMode: TaxMode;
	declare taxRateBp: number;
	declare categoryFactorsBp: CreationOptional<Partial<Record<PartCategory, number>>>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initRegion(sequelize: Sequelize) {
	Region.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			code: { type: DataTypes.STRING(8), allowNull: false, unique: true },
			name: { type: DataTypes.STRING(80), allowNull: false },
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			taxMode: { type: DataTypes.STRING(16), allowNull: false },
			taxRateBp: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
			categoryFactorsBp: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'regions', underscored: true }
	);
}
