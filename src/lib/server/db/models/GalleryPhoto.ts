import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { GuideRevision } from './GuideRevision.js';
import type { Photo } from './Photo.js';
import { GUIDE_EXTRAS } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/** A photo in one revision's gallery: its assembly stage, place, caption and alt text. */
export class GalleryPhoto extends Model<
	InferAttributes<GalleryPhoto>,
	InferCreationAttributes<GalleryPhoto>
> {
	declare id: CreationOptional<number>;
	declare revisionId: ForeignKey<GuideRevision['id']>;
	declare photoId: ForeignKey<Photo['id']>;
	declare stage: string;
	declare position: number;
	declare caption: string;
	declare altText: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initGalleryPhoto(sequelize: Sequelize) {
	GalleryPhoto.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			stage: { type: DataTypes.STRING(24), allowNull: false },
			position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
			altText: { type: DataTypes.STRING(300), allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'gallery_photos', underscored: true }
	);
	// The published gallery on the guide page (services/guide-page-extras.ts).
	bumpAfterWrites(GalleryPhoto, sequelize, GUIDE_EXTRAS);
}
