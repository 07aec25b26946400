import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type {
	ReportCategory,
	ReportState,
	ReportSubjectType
} from '../../../domain/content-reports.js';
import type { User } from './User.js';

/**
 * A signed-in person's report about a guide, build or photo, open until an editor decides.
 * `openMarker` is 1 while open and null once decided, so the unique index
 * (reporter, subject, openMarker) allows one open report per reporter and subject.
 */
export class ContentReport extends Model<
	InferAttributes<ContentReport>,
	InferCreationAttributes<ContentReport>
> {
	declare id: CreationOptional<number>;
	declare subjectType: ReportSubjectType;
	/** A string so one column can hold any subject's key. */
	declare subjectId: string;
	declare reporterId: ForeignKey<User['id']>;
	declare category: ReportCategory;
	declare detail: string;
	declare state: CreationOptional<ReportState>;
	declare openMarker: CreationOptional<number | null>;
	declare decidedById: ForeignKey<User['id']> | null;
	declare decidedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initContentReport(sequelize: Sequelize) {
	ContentReport.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			subjectType: { type: DataTypes.STRING(16), allowNull: false },
			subjectId: { type: DataTypes.STRING(64), allowNull: false },
			category: { type: DataTypes.STRING(24), allowNull: false },
			detail: { type: DataTypes.TEXT, allowNull: false },
			state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'open' },
			openMarker: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true, defaultValue: 1 },
			decidedAt: { type: DataTypes.DATE, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'content_reports', underscored: true }
	);
}
