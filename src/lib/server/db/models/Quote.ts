import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { QuoteSource, QuoteStatus } from '../../../domain/types.js';
import type { Part } from './Part.js';
import type { Region } from './Region.js';
import type { Store } from './Store.js';
import { PART_CATALOG } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/** One observed shelf price: integer minor units of `currency`, as the store showed it. */
export class Quote extends Model<InferAttributes<Quote>, InferCreationAttributes<Quote>> {
	declare id: CreationOptional<number>;
	declare partId: ForeignKey<Part['id']>;
	declare storeId: ForeignKey<Store['id']>;
	declare regionId: ForeignKey<Region['id']>;
	declare amountMinor: number;
	declare currency: string;
	declare taxIncluded: boolean;
	declare shippingMinor: CreationOptional<number>;
	declare observedAt: Date;
	declare url: string | null;
	declare source: QuoteSource;
	declare status: CreationOptional<QuoteStatus>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initQuote(sequelize: Sequelize) {
	Quote.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			amountMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			currency: { type: DataTypes.CHAR(3), allowNull: false },
			taxIncluded: { type: DataTypes.BOOLEAN, allowNull: false },
			shippingMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
			observedAt: { type: DataTypes.DATE, allowNull: false },
			url: { type: DataTypes.STRING(500), allowNull: true },
			source: { type: DataTypes.STRING(16), allowNull: false },
			status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{
			sequelize,
			tableName: 'quotes',
			underscored: true,
			indexes: [{ fields: ['part_id', 'region_id', 'observed_at'] }]
		}
	);
	// A quote moves a part's price in the catalog's kept answers (http/list-caching.ts).
	bumpAfterWrites(Quote, sequelize, PART_CATALOG);
}
