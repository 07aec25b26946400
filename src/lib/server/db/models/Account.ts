import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';

/** Auth.js adapter model: a sign-in provider linked to a user. */
export class Account extends Model<InferAttributes<Account>, InferCreationAttributes<Account>> {
	declare id: CreationOptional<string>;
	declare type: string;
	declare provider: string;
	declare providerAccountId: string;
	declare refresh_token: CreationOptional<string | null>;
	declare access_token: CreationOptional<string | null>;
	declare expires_at: CreationOptional<number | null>;
	declare token_type: CreationOptional<string | null>;
	declare scope: CreationOptional<string | null>;
	declare id_token: CreationOptional<string | null>;
	declare session_state: CreationOptional<string | null>;
	declare userId: string;
}

export function initAccount(sequelize: Sequelize) {
	Account.init(
		{
			id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
			type: { type: DataTypes.STRING(40), allowNull: false },
			provider: { type: DataTypes.STRING(80), allowNull: false },
			providerAccountId: { type: DataTypes.STRING(255), allowNull: false },
			refresh_token: DataTypes.TEXT,
			access_token: DataTypes.TEXT,
			expires_at: DataTypes.INTEGER,
			token_type: DataTypes.STRING(40),
			scope: DataTypes.STRING(255),
			id_token: DataTypes.TEXT,
			session_state: DataTypes.STRING(255),
			userId: { type: DataTypes.UUID, allowNull: false }
		},
		{ sequelize, tableName: 'accounts', underscored: true, timestamps: false }
	);
}
