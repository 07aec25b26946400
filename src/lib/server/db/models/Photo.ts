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
import { GUIDE_EXTRAS, PART_CATALOG } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/** One stored file of a photo: a width in one format, under a key in the photo store. */
export interface StoredVariant {
	format: 'avif' | 'webp' | 'jpeg';
	width: number;
	height: number;
	key: string;
	bytes: number;
}

export const PHOTO_STATES = ['processing', 'ready', 'failed'] as const;
export type PhotoState = (typeof PHOTO_STATES)[number];

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
	/** processing: the original waits for the background job; only `ready` photos are shown. */
	declare state: CreationOptional<PhotoState>;
	declare variantsDone: CreationOptional<number>;
	declare variantsTotal: CreationOptional<number>;
	/** Why processing failed, in words for the uploader. */
	declare failure: CreationOptional<string | null>;
	/** The checked upload under its own random key (never served), until processing ends. */
	declare originalKey: CreationOptional<string | null>;
	declare attempts: CreationOptional<number>;
	declare attemptId: CreationOptional<string | null>;
	declare leaseUntil: CreationOptional<Date | null>;
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
			state: {
				type: DataTypes.ENUM(...PHOTO_STATES),
				allowNull: false,
				defaultValue: 'ready'
			},
			variantsDone: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
			variantsTotal: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
			failure: { type: DataTypes.STRING(300), allowNull: true },
			originalKey: { type: DataTypes.STRING(80), allowNull: true },
			attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
			attemptId: { type: DataTypes.CHAR(36), allowNull: true },
			leaseUntil: { type: DataTypes.DATE(3), allowNull: true },
			caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
			altText: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
			hiddenAt: { type: DataTypes.DATE, allowNull: true },
			hiddenReason: { type: DataTypes.STRING(500), allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'photos', underscored: true }
	);
	// A part photo is the catalog's thumbnail (http/list-caching.ts); guide photos share the
	// table, and moving the counter for them too only costs one extra catalog render.
	bumpAfterWrites(Photo, sequelize, PART_CATALOG);
	// Gallery photos and part thumbnails on the guide page (services/guide-page-extras.ts).
	bumpAfterWrites(Photo, sequelize, GUIDE_EXTRAS);
}
