import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';

/** A signed-in reader follows an author: notices when they publish, and an optional newsletter audience. */
export class Follow extends Model<InferAttributes<Follow>, InferCreationAttributes<Follow>> {
	declare followerId: string;
	declare authorId: string;
	declare createdAt: CreationOptional<Date>;
}

export function initFollow(sequelize: Sequelize) {
	Follow.init(
		{
			followerId: { type: DataTypes.UUID, primaryKey: true },
			authorId: { type: DataTypes.UUID, primaryKey: true },
			createdAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'follows', underscored: true, updatedAt: false }
	);
}
