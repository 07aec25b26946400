import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Region } from './Region.js';
import { PART_CATALOG } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

export class Store extends Model<InferAttributes<Store>, InferCreationAttributes<Store>> {
	declare id: CreationOptional<number>;
	declare name: string;
	declare regionId: ForeignKey<Region['id']>;
	declare url: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initStore(sequelize: Sequelize) {
	Store.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
			url: { type: DataTypes.STRING(500), allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'stores', underscored: true }
	);
	// A store's name and link reach the catalog's prices (http/list-caching.ts).
	bumpAfterWrites(Store, sequelize, PART_CATALOG);
}
