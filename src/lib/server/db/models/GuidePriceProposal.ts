import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { GuideRevision } from './GuideRevision.js';
import type { Part } from './Part.js';
import type { Quote } from './Quote.js';
import type { Region } from './Region.js';
import type { Store } from './Store.js';

/**
 * A price an author typed into one slot of a revision: a proposal, never a quote. Nothing
 * public reads it; approving the revision turns it into a Quote (services/guide-reviews).
 */
export class GuidePriceProposal extends Model<
	InferAttributes<GuidePriceProposal>,
	InferCreationAttributes<GuidePriceProposal>
> {
	declare id: CreationOptional<number>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
	/** The slot's position in its revision (1-based). */
	declare position: number;
	declare partId: ForeignKey<Part['id']>;
	declare storeId: ForeignKey<Store['id']>;
	declare regionId: ForeignKey<Region['id']>;
	declare amountMinor: number;
	declare currency: string;
	declare taxIncluded: boolean;
	declare observedAt: Date;
	/** The quote it became on approval; null while proposed. */
	declare quoteId: CreationOptional<ForeignKey<Quote['id']> | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initGuidePriceProposal(sequelize: Sequelize) {
	GuidePriceProposal.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
			amountMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			taxIncluded: { type: DataTypes.BOOLEAN, allowNull: false },
			observedAt: { type: DataTypes.DATE, allowNull: false },
			quoteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{
			sequelize,
			tableName: 'guide_price_proposals',
			underscored: true,
			indexes: [{ unique: true, fields: ['revision_id', 'position'] }]
		}
	);
}
