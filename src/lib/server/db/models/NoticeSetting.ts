import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { NoticeKind } from './Notice.js';

/** A user's choice for one notice kind; without a row the kind's default applies (services/notices.ts). */
export class NoticeSetting extends Model<
	InferAttributes<NoticeSetting>,
	InferCreationAttributes<NoticeSetting>
> {
	declare userId: string;
	declare kind: NoticeKind;
	declare inApp: boolean;
	declare email: boolean;
	declare updatedAt: CreationOptional<Date>;
}

export function initNoticeSetting(sequelize: Sequelize) {
	NoticeSetting.init(
		{
			userId: { type: DataTypes.UUID, primaryKey: true },
			kind: { type: DataTypes.STRING(24), primaryKey: true },
			inApp: { type: DataTypes.BOOLEAN, allowNull: false },
			email: { type: DataTypes.BOOLEAN, allowNull: false },
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'notice_settings', underscored: true, createdAt: false }
	);
}
