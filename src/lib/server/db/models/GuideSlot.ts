import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { PartCategory } from '../../../domain/types.js';
import type { GuideRevision } from './GuideRevision.js';
import type { Part } from './Part.js';
import type { Quote } from './Quote.js';

/**
 * One role in a revision's build: the author's pick, why, and the quote it is priced at.
 * `slotKey` is the slot's own identity: made when the author first adds the slot and carried
 * to every later revision, unique within a revision. Sync, drift, revision diff and builds
 * match slots by it; the label is display text and may repeat.
 */
export class GuideSlot extends Model<
	InferAttributes<GuideSlot>,
	InferCreationAttributes<GuideSlot>
> {
	declare id: CreationOptional<number>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
	declare slotKey: CreationOptional<string>;
	declare category: PartCategory;
	declare label: string;
	declare position: number;
	declare quantity: CreationOptional<number>;
	declare pickPartId: ForeignKey<Part['id']>;
	declare reason: string;
	declare priceQuoteId: ForeignKey<Quote['id']> | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initGuideSlot(sequelize: Sequelize) {
	GuideSlot.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			// A new slot gets a fresh key; a slot carried from an earlier revision passes its own.
			slotKey: { type: DataTypes.CHAR(36), allowNull: false, defaultValue: DataTypes.UUIDV4 },
			category: { type: DataTypes.STRING(16), allowNull: false },
			label: { type: DataTypes.STRING(80), allowNull: false },
			position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			quantity: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			reason: { type: DataTypes.TEXT, allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'guide_slots', underscored: true }
	);
}
