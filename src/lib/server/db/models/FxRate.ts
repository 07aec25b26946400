import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';

/** Units of `currency` per 1 EUR on `asOf`, kept as the decimal string it was published as. */
export class FxRate extends Model<InferAttributes<FxRate>, InferCreationAttributes<FxRate>> {
	declare id: CreationOptional<number>;
	declare currency: string;
	declare ratePerEur: string;
	declare asOf: string; // YYYY-MM-DD
	declare source: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initFxRate(sequelize: Sequelize) {
	FxRate.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			ratePerEur: { type: DataTypes.DECIMAL(18, 6), allowNull: false },
			asOf: { type: DataTypes.DATEONLY, allowNull: false },
			source: { type: DataTypes.STRING(200), allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{
			sequelize,
			tableName: 'fx_rates',
			underscored: true,
			indexes: [{ unique: true, fields: ['currency', 'as_of'] }]
		}
	);
}
