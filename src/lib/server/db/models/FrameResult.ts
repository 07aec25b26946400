import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { GuideRevision } from './GuideRevision.js';

/** One measured benchmark of a revision's build; FPS stored in tenths (integer, exact). */
export class FrameResult extends Model<
	InferAttributes<FrameResult>,
	InferCreationAttributes<FrameResult>
> {
	declare id: CreationOptional<number>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
	declare position: CreationOptional<number>;
	/** Game or application title. */
	declare workload: string;
	/** e.g. '1920x1080'. */
	declare resolution: string;
	declare preset: CreationOptional<string>;
	declare avgFpsTenths: number;
	declare low1FpsTenths: number | null;
	declare notes: CreationOptional<string>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initFrameResult(sequelize: Sequelize) {
	FrameResult.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
			workload: { type: DataTypes.STRING(120), allowNull: false },
			resolution: { type: DataTypes.STRING(20), allowNull: false },
			preset: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
			avgFpsTenths: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			low1FpsTenths: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'frame_results', underscored: true }
	);
}
