import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Role } from '../../../domain/types.js';

/**
 * An account. The id is a UUID so it matches what the Auth.js adapter expects and so
 * account ids cannot be enumerated. passwordHash is null for link-only accounts.
 */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<string>;
	declare email: string;
	declare name: string | null;
	declare passwordHash: CreationOptional<string | null>;
	declare role: CreationOptional<Role>;
	/** Named for the Auth.js adapter; stored as email_verified_at. */
	declare emailVerified: CreationOptional<Date | null>;
	declare image: CreationOptional<string | null>;
	/** Sessions carrying an older number are refused (see the auth hook). */
	declare sessionVersion: CreationOptional<number>;
	declare disabledAt: CreationOptional<Date | null>;
	/** The weekly upkeep digest e-mail (new alerts on the author's guides); off by default. */
	declare upkeepDigest: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initUser(sequelize: Sequelize) {
	User.init(
		{
			id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
			email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
			name: { type: DataTypes.STRING(120), allowNull: true },
			passwordHash: { type: DataTypes.STRING(255), allowNull: true },
			role: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'reader' },
			emailVerified: { type: DataTypes.DATE, allowNull: true, field: 'email_verified_at' },
			image: { type: DataTypes.STRING(500), allowNull: true },
			sessionVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			disabledAt: { type: DataTypes.DATE, allowNull: true },
			upkeepDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'users', underscored: true }
	);
}
