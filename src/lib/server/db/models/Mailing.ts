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

export const MAILING_STATUSES = ['draft', 'sending', 'finished'] as const;
export type MailingStatus = (typeof MAILING_STATUSES)[number];

/** Who a mailing goes to, besides being a confirmed subscriber (domain/newsletter-audience.ts). */
export interface MailingFilters {
	/** Guide regions a subscriber must want (their `regions`); empty: any. */
	regions: string[];
	/** Tags a subscriber's tags must share one of; empty: any. */
	tags: string[];
	/** Subscribers who follow the author and asked for their new guides get it too. */
	followers: boolean;
}

/** Counts per outcome, written when the last job of a mailing settles. */
export interface MailingSummary {
	sent: number;
	failed: number;
	skipped: number;
	inDoubt: number;
}

/** One newsletter send about one approved revision (services/mailings.ts). */
export class Mailing extends Model<InferAttributes<Mailing>, InferCreationAttributes<Mailing>> {
	declare id: CreationOptional<number>;
	declare guideId: ForeignKey<Guide['id']>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
	declare createdById: ForeignKey<User['id']> | null;
	declare status: CreationOptional<MailingStatus>;
	declare subject: string;
	declare intro: string;
	declare filters: MailingFilters;
	declare linkOrigin: CreationOptional<string | null>;
	declare recipients: CreationOptional<number | null>;
	declare testSentAt: CreationOptional<Date | null>;
	declare startedAt: CreationOptional<Date | null>;
	declare finishedAt: CreationOptional<Date | null>;
	declare summary: CreationOptional<MailingSummary | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initMailing(sequelize: Sequelize) {
	Mailing.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'draft' },
			subject: { type: DataTypes.STRING(150), allowNull: false },
			intro: { type: DataTypes.TEXT, allowNull: false },
			filters: { type: DataTypes.JSON, allowNull: false },
			linkOrigin: { type: DataTypes.STRING(200), allowNull: true },
			recipients: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			testSentAt: { type: DataTypes.DATE, allowNull: true },
			startedAt: { type: DataTypes.DATE, allowNull: true },
			finishedAt: { type: DataTypes.DATE, allowNull: true },
			summary: { type: DataTypes.JSON, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'mailings', underscored: true }
	);
}
