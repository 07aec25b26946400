import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { GuideRevision } from './GuideRevision.js';

/** Temperatures (°C) and utilisation (%) of a revision's build under a named load. */
export class ThermalResult extends Model<
	InferAttributes<ThermalResult>,
	InferCreationAttributes<ThermalResult>
> {
	declare id: CreationOptional<number>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
	declare position: CreationOptional<number>;
	declare loadName: string;
	declare cpuTempC: number | null;
	declare gpuTempC: number | null;
	declare cpuUtilPct: number | null;
	declare gpuUtilPct: number | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initThermalResult(sequelize: Sequelize) {
	ThermalResult.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
			loadName: { type: DataTypes.STRING(120), allowNull: false },
			cpuTempC: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
			gpuTempC: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
			cpuUtilPct: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
			gpuUtilPct: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'thermal_results', underscored: true }
	);
}
