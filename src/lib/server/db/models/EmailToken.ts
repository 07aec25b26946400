import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';

export type EmailTokenPurpose = 'verify_email' | 'reset_password' | 'change_email';

/** A single-use e-mailed token; only its sha256 is stored. */
export class EmailToken extends Model<
	InferAttributes<EmailToken>,
	InferCreationAttributes<EmailToken>
> {
	declare id: CreationOptional<number>;
	declare userId: string;
	declare purpose: EmailTokenPurpose;
	declare tokenHash: string;
	declare expiresAt: Date;
	declare usedAt: CreationOptional<Date | null>;
	/** For change_email: the address to move the account to once confirmed. */
	declare newEmail: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initEmailToken(sequelize: Sequelize) {
	EmailToken.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			userId: { type: DataTypes.UUID, allowNull: false },
			purpose: { type: DataTypes.STRING(20), allowNull: false },
			tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
			expiresAt: { type: DataTypes.DATE, allowNull: false },
			usedAt: { type: DataTypes.DATE, allowNull: true },
			newEmail: { type: DataTypes.STRING(254), allowNull: true },
			createdAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'email_tokens', underscored: true, updatedAt: false }
	);
}
