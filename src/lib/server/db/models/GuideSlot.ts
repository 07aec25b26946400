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

/** One role in a revision's build: the author's pick, why, and the quote it is priced at. */
export class GuideSlot extends Model<
	InferAttributes<GuideSlot>,
	InferCreationAttributes<GuideSlot>
> {
	declare id: CreationOptional<number>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
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
