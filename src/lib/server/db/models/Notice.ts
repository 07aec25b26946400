import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { User } from './User.js';

/** What a notice is about; each kind has its own in-app and e-mail setting. */
export const NOTICE_KINDS = [
	'author_published',
	'source_revised',
	'revision_decided',
	'queue_gained'
] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];

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
