import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { User } from './User.js';

import { NOTICE_KINDS, type NoticeKind } from '../../../domain/notice-kinds.js';

export { NOTICE_KINDS, type NoticeKind };

/** One in-app notice under the bell; `linkPath` is a same-site path to the page it is about. */
export class Notice extends Model<InferAttributes<Notice>, InferCreationAttributes<Notice>> {
	declare id: CreationOptional<number>;
	declare userId: ForeignKey<User['id']>;
	declare kind: NoticeKind;
	declare message: string;
	declare linkPath: string;
	declare readAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initNotice(sequelize: Sequelize) {
	Notice.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			kind: { type: DataTypes.STRING(24), allowNull: false },
			message: { type: DataTypes.STRING(300), allowNull: false },
			linkPath: { type: DataTypes.STRING(300), allowNull: false },
			readAt: { type: DataTypes.DATE, allowNull: true },
			createdAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'notices', underscored: true, updatedAt: false }
	);
}
