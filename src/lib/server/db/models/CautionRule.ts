import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { CautionCondition } from '../../../domain/pairing-cautions.js';
import type { User } from './User.js';

/**
 * An editor's pairing caution: a message shown as a `caution` finding when every
 * condition holds for the build (domain/pairing-cautions.ts). Conditions are data checked
 * by $lib/schemas/caution-rules before they get here; `version` guards against two
 * editors saving over each other.
 */
export class CautionRule extends Model<
	InferAttributes<CautionRule>,
	InferCreationAttributes<CautionRule>
> {
	declare id: CreationOptional<number>;
	declare title: string;
	declare message: string;
	declare active: CreationOptional<boolean>;
	declare conditions: CautionCondition[];
	declare authorId: ForeignKey<User['id']> | null;
	declare version: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initCautionRule(sequelize: Sequelize) {
	CautionRule.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			title: { type: DataTypes.STRING(120), allowNull: false, unique: true },
			message: { type: DataTypes.TEXT, allowNull: false },
			active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
			conditions: { type: DataTypes.JSON, allowNull: false },
			version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'caution_rules', underscored: true }
	);
}
