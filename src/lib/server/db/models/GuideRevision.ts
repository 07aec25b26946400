import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Guide } from './Guide.js';
import type { User } from './User.js';

/**
 * An immutable snapshot of a guide's content once submitted. Build notes are kept as the
 * author's Markdown plus the sanitised HTML rendered once on save.
 */
export class GuideRevision extends Model<
	InferAttributes<GuideRevision>,
	InferCreationAttributes<GuideRevision>
> {
	declare id: CreationOptional<number>;
	declare guideId: ForeignKey<Guide['id']>;
	declare number: number;
	declare buildNotesMd: string;
	declare buildNotesHtml: CreationOptional<string | null>;
	declare submittedAt: Date | null;
	declare reviewedAt: Date | null;
	declare publishedAt: Date | null;
	declare reviewerId: ForeignKey<User['id']> | null;
	declare reviewNote: string | null;
	/** The editor's decision on this revision once reviewed (a copy of its Review row's). */
	declare decision: CreationOptional<'approve' | 'request_changes' | 'decline' | null>;
	/** The author marked this revision as major: once approved it may be mailed like a new guide. */
	declare major: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initGuideRevision(sequelize: Sequelize) {
	GuideRevision.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			buildNotesMd: { type: DataTypes.TEXT('medium'), allowNull: false },
			buildNotesHtml: { type: DataTypes.TEXT('medium'), allowNull: true },
			submittedAt: { type: DataTypes.DATE, allowNull: true },
			reviewedAt: { type: DataTypes.DATE, allowNull: true },
			publishedAt: { type: DataTypes.DATE, allowNull: true },
			reviewNote: { type: DataTypes.TEXT, allowNull: true },
			decision: { type: DataTypes.STRING(20), allowNull: true },
			major: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{
			sequelize,
			tableName: 'guide_revisions',
			underscored: true,
			indexes: [{ unique: true, fields: ['guide_id', 'number'] }]
		}
	);
}
