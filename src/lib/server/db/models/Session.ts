import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';

/** Auth.js adapter model; unused with JWT sessions but part of the adapter's contract. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
	declare id: CreationOptional<string>;
	declare expires: Date;
	declare sessionToken: string;
	declare userId: string;
}

export function initSession(sequelize: Sequelize) {
	Session.init(
		{
			id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
			expires: { type: DataTypes.DATE, allowNull: false },
			sessionToken: { type: DataTypes.STRING(255), allowNull: false, unique: true },
			userId: { type: DataTypes.UUID, allowNull: false }
		},
		{ sequelize, tableName: 'sessions', underscored: true, timestamps: false }
	);
}
