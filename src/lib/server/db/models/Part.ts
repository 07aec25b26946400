import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { PartCategory } from '../../../domain/types.js';
import { GUIDE_EXTRAS, PART_CATALOG } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/** A catalog item. specs is validated by the category's zod schema before every write. */
export class Part extends Model<InferAttributes<Part>, InferCreationAttributes<Part>> {
	declare id: CreationOptional<number>;
	declare category: PartCategory;
	declare brand: string;
	declare model: string;
	declare slug: string;
	declare specs: Record<string, unknown>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initPart(sequelize: Sequelize) {
	Part.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			category: { type: DataTypes.STRING(16), allowNull: false },
			brand: { type: DataTypes.STRING(80), allowNull: false },
			model: { type: DataTypes.STRING(120), allowNull: false },
			slug: { type: DataTypes.STRING(140), allowNull: false, unique: true },
			specs: { type: DataTypes.JSON, allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'parts', underscored: true, indexes: [{ fields: ['category'] }] }
	);
	// The catalog's kept answers (http/list-caching.ts) show names, specs and prices.
	bumpAfterWrites(Part, sequelize, PART_CATALOG);
	// Part thumbnails on the guide page are found by the part's slug (services/guide-page-extras.ts).
	bumpAfterWrites(Part, sequelize, GUIDE_EXTRAS, { listed: new Set(['slug']) });
}
