import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { SubscriberAudience } from '../../../domain/newsletter-audience.js';
import type { Region } from './Region.js';
import type { User } from './User.js';

export const SUBSCRIBER_STATUSES = ['pending', 'confirmed', 'unsubscribed', 'suppressed'] as const;
export type SubscriberStatus = (typeof SUBSCRIBER_STATUSES)[number];
export type { SubscriberAudience } from '../../../domain/newsletter-audience.js';

/**
 * One newsletter address and its preferences (services/subscribers.ts). Mail goes only to
 * `confirmed` rows. Only the SHA-256 of the pending confirmation token is stored; manage and
 * unsubscribe links are signed and carry `linkVersion`, bumped to revoke all of them.
 */
export class Subscriber extends Model<
	InferAttributes<Subscriber>,
	InferCreationAttributes<Subscriber>
> {
	declare id: CreationOptional<number>;
	declare email: string;
	declare userId: ForeignKey<User['id']> | null;
	declare status: CreationOptional<SubscriberStatus>;
	declare homeRegionId: ForeignKey<Region['id']>;
	/** Region codes of the guides wanted; empty means every region. */
	declare regions: CreationOptional<string[]>;
	declare budgetMinMinor: CreationOptional<number | null>;
	declare budgetMaxMinor: CreationOptional<number | null>;
	declare tags: CreationOptional<string[]>;
	declare audience: CreationOptional<SubscriberAudience>;
	declare confirmTokenHash: CreationOptional<string | null>;
	declare confirmSentAt: CreationOptional<Date | null>;
	declare linkVersion: CreationOptional<number>;
	declare confirmedAt: CreationOptional<Date | null>;
	declare unsubscribedAt: CreationOptional<Date | null>;
	declare suppressedAt: CreationOptional<Date | null>;
	declare suppressedReason: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initSubscriber(sequelize: Sequelize) {
	Subscriber.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
			status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'pending' },
			regions: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
			budgetMinMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			budgetMaxMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			tags: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
			audience: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'filters' },
			confirmTokenHash: { type: DataTypes.CHAR(64), allowNull: true },
			confirmSentAt: { type: DataTypes.DATE, allowNull: true },
			linkVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			confirmedAt: { type: DataTypes.DATE, allowNull: true },
			unsubscribedAt: { type: DataTypes.DATE, allowNull: true },
			suppressedAt: { type: DataTypes.DATE, allowNull: true },
			suppressedReason: { type: DataTypes.STRING(200), allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'subscribers', underscored: true }
	);
}
