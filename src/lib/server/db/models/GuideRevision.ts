import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize,
	Transaction
} from 'sequelize';
import { Guide } from './Guide.js';
import type { Region } from './Region.js';
import type { User } from './User.js';

/**
 * An immutable snapshot of a guide's content once submitted. Build notes are kept as the
 * author's Markdown plus the sanitised HTML rendered once on save. The guide's details
 * (title … walkthrough link) live here too: public pages show the published revision's,
 * and the guide row's columns are its copy, written only when an editor approves.
 */
export class GuideRevision extends Model<
	InferAttributes<GuideRevision>,
	InferCreationAttributes<GuideRevision>
> {
	declare id: CreationOptional<number>;
	declare guideId: ForeignKey<Guide['id']>;
	declare number: number;
	// Optional on create only because the hook below fills them from the guide row.
	declare title: CreationOptional<string>;
	declare summary: CreationOptional<string>;
	/** In minor units of the base region's currency. */
	declare targetBudgetMinor: CreationOptional<number>;
	declare baseRegionId: CreationOptional<ForeignKey<Region['id']>>;
	declare tags: CreationOptional<string[]>;
	declare disclosure: CreationOptional<'none' | 'sponsored' | 'affiliate'>;
	declare disclosureNote: CreationOptional<string | null>;
	declare walkthroughUrl: CreationOptional<string | null>;
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
			title: { type: DataTypes.STRING(160), allowNull: false },
			summary: { type: DataTypes.TEXT, allowNull: false },
			targetBudgetMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			tags: { type: DataTypes.JSON, allowNull: false },
			disclosure: { type: DataTypes.STRING(16), allowNull: false },
			disclosureNote: { type: DataTypes.TEXT, allowNull: true },
			walkthroughUrl: { type: DataTypes.STRING(500), allowNull: true },
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
			indexes: [{ unique: true, fields: ['guide_id', 'number'] }],
			hooks: {
				// A revision created without details (seeders and fixtures that predate them)
				// starts from its guide's live details, as the migration's backfill did.
				async beforeValidate(revision, options) {
					if (revision.title !== undefined && revision.title !== null) return;
					// create() passes its own options, transaction included, to validation hooks.
					const { transaction } = options as { transaction?: Transaction };
					const guide = await Guide.findByPk(revision.guideId, { transaction });
					if (!guide) return;
					revision.set(detailsOf(guide));
				}
			}
		}
	);
}

/** The details a revision carries, as stored on a guide row (its published copy). */
export function detailsOf(from: Guide | GuideRevision) {
	return {
		title: from.title,
		summary: from.summary,
		targetBudgetMinor: Number(from.targetBudgetMinor),
		baseRegionId: from.baseRegionId,
		tags: from.tags ?? [],
		disclosure: from.disclosure,
		disclosureNote: from.disclosureNote ?? null,
		walkthroughUrl: from.walkthroughUrl ?? null
	};
}
