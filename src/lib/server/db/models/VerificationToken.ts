import { DataTypes, Model } from 'sequelize';
import type { InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize';

/** Auth.js sign-in link token (stored hashed by Auth.js), deleted on use. */
export class VerificationToken extends Model<
	InferAttributes<VerificationToken>,
	InferCreationAttributes<VerificationToken>
> {
	declare token: string;
	declare identifier: string;
	declare expires: Date;
}

export function initVerificationToken(sequelize: Sequelize) {
	VerificationToken.init(
		{
			token: { type: DataTypes.STRING(255), primaryKey: true },
			identifier: { type: DataTypes.STRING(254), allowNull: false },
			expires: { type: DataTypes.DATE, allowNull: false }
		},
		{ sequelize, tableName: 'verification_tokens', underscored: true, timestamps: false }
	);
}
