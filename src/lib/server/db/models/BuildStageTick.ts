import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Build } from './Build.js';

/** An assembly stage a build's owner has ticked off (services/build-checklist.ts). */
export class BuildStageTick extends Model<
	InferAttributes<BuildStageTick>,
	InferCreationAttributes<BuildStageTick>
> {
	declare id: CreationOptional<number>;
	declare buildId: ForeignKey<Build['id']>;
	declare stage: string;
	declare tickedAt: Date;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initBuildStageTick(sequelize: Sequelize) {
	BuildStageTick.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			stage: { type: DataTypes.STRING(24), allowNull: false },
			tickedAt: { type: DataTypes.DATE, allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'build_stage_ticks', underscored: true }
	);
}
