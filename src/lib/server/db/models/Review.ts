import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Guide } from './Guide.js';
import type { GuideRevision } from './GuideRevision.js';
import type { User } from './User.js';

export const REVIEW_DECISIONS = [
	'approve',
	'request_changes',
	'decline',
	'unpublish',
	'archive'
] as const;
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number];

/** An editor's note on one slot of the revision, matched by the slot's label. */
export interface SlotNote {
	label: string;
	note: string;
}

/**
 * One editor decision on a guide: on a submitted revision (approve, request changes,
 * decline) or on the guide itself (unpublish, archive: revisionId null). Append-only.
 */
export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
	declare id: CreationOptional<number>;
	declare guideId: ForeignKey<Guide['id']>;
	declare revisionId: ForeignKey<GuideRevision['id']> | null;
	declare reviewerId: ForeignKey<User['id']> | null;
	declare decision: ReviewDecision;
	declare note: string | null;
	declare slotNotes: CreationOptional<SlotNote[]>;
	/** An admin decided on their own guide; the audit trail records it too. */
	declare selfReviewOverride: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
}

export function initReview(sequelize: Sequelize) {
	Review.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			decision: { type: DataTypes.STRING(20), allowNull: false },
			note: { type: DataTypes.TEXT, allowNull: true },
			slotNotes: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
			selfReviewOverride: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			createdAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'reviews', underscored: true, updatedAt: false }
	);
}
