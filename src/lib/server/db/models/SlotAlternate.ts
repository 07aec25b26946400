import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { AlternateReason } from '../../../domain/types.js';
import type { GuideSlot } from './GuideSlot.js';
import type { Part } from './Part.js';

/** A ranked other part for a slot (rank 1 is the author's first fallback). */
export class SlotAlternate extends Model<
	InferAttributes<SlotAlternate>,
	InferCreationAttributes<SlotAlternate>
> {
	declare id: CreationOptional<number>;
	declare slotId: ForeignKey<GuideSlot['id']>;
	declare partId: ForeignKey<Part['id']>;
	declare rank: number;
	declare reasonTag: AlternateReason;
	declare note: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initSlotAlternate(sequelize: Sequelize) {
	SlotAlternate.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			rank: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			reasonTag: { type: DataTypes.STRING(20), allowNull: false },
			note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{
			sequelize,
			tableName: 'slot_alternates',
			underscored: true,
			indexes: [{ unique: true, fields: ['slot_id', 'rank'] }]
		}
	);
}
