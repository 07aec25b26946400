import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import { GUIDE_EXTRAS } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/** An author's tip settings; an author without a row takes tips and has no message. */
export class TipSettings extends Model<
	InferAttributes<TipSettings>,
	InferCreationAttributes<TipSettings>
> {
	declare userId: string;
	declare tipsEnabled: boolean;
	declare thankYouMessage: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initTipSettings(sequelize: Sequelize) {
	TipSettings.init(
		{
			userId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
			tipsEnabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
			thankYouMessage: { type: DataTypes.STRING(280), allowNull: false, defaultValue: '' },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'tip_settings', underscored: true }
	);
	// Whether the guide page offers tips (services/guide-page-extras.ts).
	bumpAfterWrites(TipSettings, sequelize, GUIDE_EXTRAS);
}
