import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Build } from './Build.js';

/** A build slot as stored before a sync, so undo can put it back exactly. */
export type SlotRowSnapshot = Record<string, unknown>;

/**
 * One sync of a build to a newer source revision: what the build's slots were before,
 * so the last sync can be undone. Written in the sync's own transaction.
 */
export class BuildSync extends Model<
	InferAttributes<BuildSync>,
	InferCreationAttributes<BuildSync>
> {
	declare id: CreationOptional<number>;
	declare buildId: ForeignKey<Build['id']>;
	declare fromRevisionId: number | null;
	declare toRevisionId: number;
	declare slotsBefore: SlotRowSnapshot[];
	declare undoneAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initBuildSync(sequelize: Sequelize) {
	BuildSync.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			fromRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			toRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			slotsBefore: { type: DataTypes.JSON, allowNull: false },
			undoneAt: { type: DataTypes.DATE, allowNull: true },
			createdAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'build_syncs', underscored: true, updatedAt: false }
	);
}
