import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Build } from './Build.js';
import type { Guide } from './Guide.js';
import type { Part } from './Part.js';
import type { User } from './User.js';

/** One stored file of a photo: a width in one format, under a key in the photo store. */
export interface StoredVariant {
	format: 'avif' | 'webp' | 'jpeg';
	width: number;
	height: number;
	key: string;
	bytes: number;
}

/**
 * A processed photo (images/pipeline.ts): the files live in the photo store under
 * `keyPrefix/`; the row keeps their list, the original's size after orientation, the bytes
 * counted against the owner's quota and a placeholder. It illustrates one guide (through
 * gallery rows per revision), one catalog part or one finished build.
 */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
	declare id: CreationOptional<number>;
	declare ownerId: ForeignKey<User['id']> | null;
	declare guideId: ForeignKey<Guide['id']> | null;
	declare partId: ForeignKey<Part['id']> | null;
	declare buildId: ForeignKey<Build['id']> | null;
	declare keyPrefix: string;
	declare width: number;
	declare height: number;
	declare bytes: number;
	declare placeholder: string;
	declare variants: StoredVariant[];
	declare caption: CreationOptional<string>;
	declare altText: CreationOptional<string>;
	declare hiddenAt: CreationOptional<Date | null>;
	declare hiddenReason: CreationOptional<string | null>;
	declare hiddenById: CreationOptional<ForeignKey<User['id']> | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initPhoto(sequelize: Sequelize) {
	Photo.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			keyPrefix: { type: DataTypes.STRING(40), allowNull: false, unique: true },
			width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			placeholder: { type: DataTypes.TEXT, allowNull: false },
			variants: { type: DataTypes.JSON, allowNull: false },
			caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
			altText: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
			hiddenAt: { type: DataTypes.DATE, allowNull: true },
			hiddenReason: { type: DataTypes.STRING(500), allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'photos', underscored: true }
	);
}
