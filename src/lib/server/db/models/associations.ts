/*
 * Every association in one place. Foreign keys are named explicitly so the attribute
 * (camelCase) and column (snake_case, via underscored) match the migrations.
 */
import { Account } from './Account.js';
import { AuditEvent } from './AuditEvent.js';
import { AuthorRequest } from './AuthorRequest.js';
import { CatalogImport } from './CatalogImport.js';
import { Guide } from './Guide.js';
import { FrameResult } from './FrameResult.js';
import { GuideRevision } from './GuideRevision.js';
import { GuideSlot } from './GuideSlot.js';
import { Part } from './Part.js';
import { Quote } from './Quote.js';
import { Region } from './Region.js';
import { RegionTaxRate } from './RegionTaxRate.js';
import { Session } from './Session.js';
import { SlotAlternate } from './SlotAlternate.js';
import { ThermalResult } from './ThermalResult.js';
import { Store } from './Store.js';
import { User } from './User.js';

export function applyAssociations() {
	Region.hasMany(Store, { foreignKey: 'regionId', as: 'stores' });
	Store.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });

	Part.hasMany(Quote, { foreignKey: 'partId', as: 'quotes' });
	Quote.belongsTo(Part, { foreignKey: 'partId', as: 'part' });
	Quote.belongsTo(Store, { foreignKey: 'storeId', as: 'store' });
	Quote.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });

	User.hasMany(Guide, { foreignKey: 'authorId', as: 'guides' });
	Guide.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
	Guide.belongsTo(Region, { foreignKey: 'baseRegionId', as: 'baseRegion' });
	Guide.hasMany(GuideRevision, { foreignKey: 'guideId', as: 'revisions' });
	Guide.belongsTo(GuideRevision, {
		foreignKey: 'publishedRevisionId',
		as: 'publishedRevision',
		constraints: false // circular with guide_revisions.guide_id; the migration adds the FK
	});

	GuideRevision.belongsTo(Guide, { foreignKey: 'guideId', as: 'guide' });
	GuideRevision.belongsTo(User, { foreignKey: 'reviewerId', as: 'reviewer' });
	GuideRevision.hasMany(GuideSlot, { foreignKey: 'revisionId', as: 'slots' });
	GuideRevision.hasMany(FrameResult, { foreignKey: 'revisionId', as: 'frameResults' });
	GuideRevision.hasMany(ThermalResult, { foreignKey: 'revisionId', as: 'thermalResults' });
	FrameResult.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });
	ThermalResult.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });

	GuideSlot.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });
	GuideSlot.belongsTo(Part, { foreignKey: 'pickPartId', as: 'pick' });
	GuideSlot.belongsTo(Quote, { foreignKey: 'priceQuoteId', as: 'priceQuote' });
	GuideSlot.hasMany(SlotAlternate, { foreignKey: 'slotId', as: 'alternates' });

	SlotAlternate.belongsTo(GuideSlot, { foreignKey: 'slotId', as: 'slot' });
	SlotAlternate.belongsTo(Part, { foreignKey: 'partId', as: 'part' });

	User.hasMany(Account, { foreignKey: 'userId', as: 'accounts' });
	User.hasMany(Session, { foreignKey: 'userId', as: 'sessions' });

	AuditEvent.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });

	User.hasMany(AuthorRequest, { foreignKey: 'userId', as: 'authorRequests' });
	AuthorRequest.belongsTo(User, { foreignKey: 'userId', as: 'user' });
	AuthorRequest.belongsTo(User, { foreignKey: 'decidedById', as: 'decidedBy' });

	Region.hasMany(RegionTaxRate, { foreignKey: 'regionId', as: 'taxRates' });
	RegionTaxRate.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });
	RegionTaxRate.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });

	CatalogImport.belongsTo(User, { foreignKey: 'editorId', as: 'editor' });
}
