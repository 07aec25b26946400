import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Guide } from './Guide.js';
import type { GuideRevision } from './GuideRevision.js';
import type { Region } from './Region.js';
import type { User } from './User.js';
import { GUIDE_EXTRAS } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

export const BUILD_VISIBILITIES = ['private', 'unlisted', 'public'] as const;
export type BuildVisibility = (typeof BUILD_VISIBILITIES)[number];

/**
 * A reader's fork of a guide revision: their own editable copy, linked to the source guide
 * and the revision it was forked from (or last synced to). `version` guards concurrent edits.
 * Private builds are the owner's alone; unlisted ones open by their link (`shareToken`);
 * public ones are also listed in the source guide's lineage.
 */
export class Build extends Model<InferAttributes<Build>, InferCreationAttributes<Build>> {
	declare id: CreationOptional<number>;
	declare ownerId: ForeignKey<User['id']>;
	declare sourceGuideId: ForeignKey<Guide['id']> | null;
	declare baseRevisionId: ForeignKey<GuideRevision['id']> | null;
	declare title: string;
	declare regionId: ForeignKey<Region['id']>;
	declare visibility: CreationOptional<BuildVisibility>;
	declare shareToken: string;
	declare notes: CreationOptional<string>;
	/** The reader's budget in minor units of the build region's currency. */
	declare budgetMinor: CreationOptional<number | null>;
	declare notifyOnNewRevision: CreationOptional<boolean>;
	/** The newest source revision the owner was e-mailed about (no repeat mails). */
	declare lastNotifiedRevisionId: CreationOptional<number | null>;
	declare version: CreationOptional<number>;
	/** Set while an editor has hidden the build after a content report (services/content-reports). */
	declare hiddenAt: CreationOptional<Date | null>;
	declare hiddenReason: CreationOptional<string | null>;
	declare hiddenById: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initBuild(sequelize: Sequelize) {
	Build.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			title: { type: DataTypes.STRING(160), allowNull: false },
			visibility: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'private' },
			shareToken: { type: DataTypes.STRING(43), allowNull: false, unique: true },
			notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
			budgetMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			notifyOnNewRevision: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
			lastNotifiedRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			hiddenAt: { type: DataTypes.DATE, allowNull: true },
			hiddenReason: { type: DataTypes.TEXT, allowNull: true },
			hiddenById: { type: DataTypes.UUID, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'builds', underscored: true }
	);
	// Forks and public builds are listed on the guide page (services/guide-page-extras.ts).
	bumpAfterWrites(Build, sequelize, GUIDE_EXTRAS);
}
