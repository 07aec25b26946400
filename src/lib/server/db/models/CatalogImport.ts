import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { PartCategory } from '../../../domain/types.js';
import type { User } from './User.js';

/** One validated CSV row as stored between preview and confirm. */
export interface ImportedPartRow {
	/** Spreadsheet row number in the uploaded file (the header is row 1). */
	row: number;
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}

/**
 * A validated CSV upload waiting for its editor to confirm it (services/catalog-csv).
 * Lives in the database so any app instance can confirm it; expires after an hour.
 */
export class CatalogImport extends Model<
	InferAttributes<CatalogImport>,
	InferCreationAttributes<CatalogImport>
> {
	declare id: string;
	declare editorId: ForeignKey<User['id']>;
	declare fileName: string;
	declare rowCount: number;
	declare payload: ImportedPartRow[];
	declare createdAt: CreationOptional<Date>;
	declare expiresAt: Date;
}

export function initCatalogImport(sequelize: Sequelize) {
	CatalogImport.init(
		{
			id: { type: DataTypes.UUID, primaryKey: true },
			fileName: { type: DataTypes.STRING(200), allowNull: false },
			rowCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			payload: { type: DataTypes.JSON, allowNull: false },
			createdAt: DataTypes.DATE,
			expiresAt: { type: DataTypes.DATE, allowNull: false }
		},
		{ sequelize, tableName: 'catalog_imports', underscored: true, updatedAt: false }
	);
}
