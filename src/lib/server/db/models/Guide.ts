import { DataTypes, Model, QueryTypes } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { GuideState } from '../../../domain/types.js';
import { GUIDE_LIST } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';
import type { GuideRevision } from './GuideRevision.js';
import type { Region } from './Region.js';
import type { User } from './User.js';

/**
 * A guide: the stable identity (slug, author) over its revisions. `version` guards
 * concurrent edits (optimistic locking on save).
 */
export class Guide extends Model<InferAttributes<Guide>, InferCreationAttributes<Guide>> {
	declare id: CreationOptional<number>;
	declare slug: string;
	declare authorId: ForeignKey<User['id']> | null;
	declare title: string;
	declare summary: string;
	/** In minor units of the base region's currency. */
	declare targetBudgetMinor: number;
	declare baseRegionId: ForeignKey<Region['id']>;
	declare tags: CreationOptional<string[]>;
	declare featured: CreationOptional<boolean>;
	declare state: CreationOptional<GuideState>;
	declare publishedRevisionId: ForeignKey<GuideRevision['id']> | null;
	declare version: CreationOptional<number>;
	/** Required on every guide: none, sponsored parts named, or affiliate links present. */
	declare disclosure: CreationOptional<'none' | 'sponsored' | 'affiliate'>;
	declare disclosureNote: CreationOptional<string | null>;
	/** Optional https link to the author's external build walkthrough. */
	declare walkthroughUrl: CreationOptional<string | null>;
	/** Set while an editor has hidden the guide after a content report (services/content-reports). */
	declare hiddenAt: CreationOptional<Date | null>;
	declare hiddenReason: CreationOptional<string | null>;
	declare hiddenById: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initGuide(sequelize: Sequelize) {
	Guide.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			slug: { type: DataTypes.STRING(140), allowNull: false, unique: true },
			title: { type: DataTypes.STRING(160), allowNull: false },
			summary: { type: DataTypes.TEXT, allowNull: false },
			targetBudgetMinor: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			tags: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
			featured: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			state: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'draft' },
			version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			disclosure: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'none' },
			disclosureNote: { type: DataTypes.TEXT, allowNull: true },
			walkthroughUrl: { type: DataTypes.STRING(500), allowNull: true },
			hiddenAt: { type: DataTypes.DATE, allowNull: true },
			hiddenReason: { type: DataTypes.TEXT, allowNull: true },
			hiddenById: { type: DataTypes.UUID, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'guides', underscored: true, indexes: [{ fields: ['state'] }] }
	);
	// A write to a guide row may change what the guide lists show: the lists' validator
	// (http/list-caching.ts) reads this counter, moved once the write has committed. Here in
	// the model, so every process that writes guides moves it, whatever it has loaded. A
	// draft save moves only the row's version (its details live on the revision): the lists
	// show nothing of that, and authors save often, so it leaves the counter alone.
	bumpAfterWrites(Guide, sequelize, GUIDE_LIST, { unlisted: new Set(['version', 'updatedAt']) });
	// guide_tags mirrors guides.tags for the indexed list of tags in use (guide-browse.ts).
	// Tags are only ever written through a row's create or save (never a bulk update), so
	// this one hook keeps the mirror, inside the same transaction as the write.
	Guide.addHook('afterSave', 'guide-tags-mirror', async (guide: Guide, options) => {
		if (!(options.fields ?? []).includes('tags')) return;
		const { transaction } = options;
		await sequelize.query('DELETE FROM guide_tags WHERE guide_id = ?', {
			type: QueryTypes.DELETE,
			replacements: [guide.id],
			transaction
		});
		const tags = [...new Set(guide.tags ?? [])];
		if (tags.length > 0)
			await sequelize.query(
				`INSERT INTO guide_tags (tag, guide_id) VALUES ${tags.map(() => '(?)').join(', ')}`,
				{ type: QueryTypes.INSERT, replacements: tags.map((t) => [t, guide.id]), transaction }
			);
	});
}
