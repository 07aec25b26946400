/*
 * Every association in one place. Foreign keys are named explicitly so the attribute
 * (camelCase) and column (snake_case, via underscored) match the migrations.
 */
import { Account } from './Account.js';
import { AuditEvent } from './AuditEvent.js';
import { AuthorRequest } from './AuthorRequest.js';
import { Build } from './Build.js';
import { BuildSlot } from './BuildSlot.js';
import { BuildStageTick } from './BuildStageTick.js';
import { BuildSync } from './BuildSync.js';
import { CatalogImport } from './CatalogImport.js';
import { CautionRule } from './CautionRule.js';
import { ContentReport } from './ContentReport.js';
import { Follow } from './Follow.js';
import { GalleryPhoto } from './GalleryPhoto.js';
import { Guide } from './Guide.js';
import { FrameResult } from './FrameResult.js';
import { GuidePriceProposal } from './GuidePriceProposal.js';
import { GuideRevision } from './GuideRevision.js';
import { GuideSlot } from './GuideSlot.js';
import { Mailing } from './Mailing.js';
import { MailJob } from './MailJob.js';
import { Notice } from './Notice.js';
import { Part } from './Part.js';
import { Photo } from './Photo.js';
import { PriceSighting } from './PriceSighting.js';
import { PriceSightingReport } from './PriceSightingReport.js';
import { Quote } from './Quote.js';
import { Region } from './Region.js';
import { RegionTaxRate } from './RegionTaxRate.js';
import { Review } from './Review.js';
import { Session } from './Session.js';
import { SlotAlternate } from './SlotAlternate.js';
import { ThermalResult } from './ThermalResult.js';
import { Tip } from './Tip.js';
import { TipSettings } from './TipSettings.js';
import { PaymentEvent } from './PaymentEvent.js';
import { Store } from './Store.js';
import { Subscriber } from './Subscriber.js';
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
	GuideRevision.belongsTo(Region, { foreignKey: 'baseRegionId', as: 'baseRegion' });
	GuideRevision.hasMany(GuidePriceProposal, { foreignKey: 'revisionId', as: 'priceProposals' });
	GuidePriceProposal.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });
	GuidePriceProposal.belongsTo(Part, { foreignKey: 'partId', as: 'part' });
	GuidePriceProposal.belongsTo(Store, { foreignKey: 'storeId', as: 'store' });
	GuidePriceProposal.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });
	GuidePriceProposal.belongsTo(Quote, { foreignKey: 'quoteId', as: 'quote' });
	Guide.hasMany(Review, { foreignKey: 'guideId', as: 'reviews' });
	Review.belongsTo(Guide, { foreignKey: 'guideId', as: 'guide' });
	Review.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });
	Review.belongsTo(User, { foreignKey: 'reviewerId', as: 'reviewer' });
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

	ContentReport.belongsTo(User, { foreignKey: 'reporterId', as: 'reporter' });
	ContentReport.belongsTo(User, { foreignKey: 'decidedById', as: 'decidedBy' });

	PriceSighting.belongsTo(Part, { foreignKey: 'partId', as: 'part' });
	PriceSighting.belongsTo(Store, { foreignKey: 'storeId', as: 'store' });
	PriceSighting.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });
	PriceSighting.belongsTo(User, { foreignKey: 'submittedById', as: 'submittedBy' });
	PriceSighting.belongsTo(User, { foreignKey: 'decidedById', as: 'decidedBy' });
	PriceSighting.belongsTo(Quote, { foreignKey: 'quoteId', as: 'quote' });
	PriceSighting.hasMany(PriceSightingReport, { foreignKey: 'sightingId', as: 'reports' });
	PriceSightingReport.belongsTo(PriceSighting, { foreignKey: 'sightingId', as: 'sighting' });
	PriceSightingReport.belongsTo(User, { foreignKey: 'userId', as: 'user' });

	CautionRule.belongsTo(User, { foreignKey: 'authorId', as: 'author' });

	User.hasMany(Build, { foreignKey: 'ownerId', as: 'builds' });
	Build.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' });
	Build.belongsTo(Guide, { foreignKey: 'sourceGuideId', as: 'sourceGuide' });
	Guide.hasMany(Build, { foreignKey: 'sourceGuideId', as: 'forks' });
	Build.belongsTo(GuideRevision, { foreignKey: 'baseRevisionId', as: 'baseRevision' });
	Build.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });
	Build.hasMany(BuildSlot, { foreignKey: 'buildId', as: 'slots' });
	BuildSlot.belongsTo(Build, { foreignKey: 'buildId', as: 'build' });
	BuildSlot.belongsTo(Part, { foreignKey: 'partId', as: 'part' });
	Build.hasMany(BuildSync, { foreignKey: 'buildId', as: 'syncs' });
	BuildSync.belongsTo(Build, { foreignKey: 'buildId', as: 'build' });

	// Photos (services/photos.ts, gallery.ts, build-checklist.ts).
	Photo.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' });
	Photo.belongsTo(User, { foreignKey: 'hiddenById', as: 'hiddenBy' });
	Photo.belongsTo(Guide, { foreignKey: 'guideId', as: 'guide' });
	Photo.belongsTo(Part, { foreignKey: 'partId', as: 'part' });
	Photo.belongsTo(Build, { foreignKey: 'buildId', as: 'build' });
	GuideRevision.hasMany(GalleryPhoto, { foreignKey: 'revisionId', as: 'gallery' });
	GalleryPhoto.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });
	GalleryPhoto.belongsTo(Photo, { foreignKey: 'photoId', as: 'photo' });
	Build.hasMany(BuildStageTick, { foreignKey: 'buildId', as: 'stageTicks' });
	BuildStageTick.belongsTo(Build, { foreignKey: 'buildId', as: 'build' });
	Tip.belongsTo(User, { foreignKey: 'supporterId', as: 'supporter' });
	Tip.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
	Tip.belongsTo(Guide, { foreignKey: 'guideId', as: 'guide' });
	Tip.belongsTo(Build, { foreignKey: 'buildId', as: 'build' });
	PaymentEvent.belongsTo(Tip, { foreignKey: 'tipId', as: 'tip' });
	User.hasOne(TipSettings, { foreignKey: 'userId', as: 'tipSettings' });

	Follow.belongsTo(User, { foreignKey: 'followerId', as: 'follower' });
	Follow.belongsTo(User, { foreignKey: 'authorId', as: 'author' });

	Subscriber.belongsTo(User, { foreignKey: 'userId', as: 'user' });
	Subscriber.belongsTo(Region, { foreignKey: 'homeRegionId', as: 'homeRegion' });
	Notice.belongsTo(User, { foreignKey: 'userId', as: 'user' });

	Mailing.belongsTo(Guide, { foreignKey: 'guideId', as: 'guide' });
	Mailing.belongsTo(GuideRevision, { foreignKey: 'revisionId', as: 'revision' });
	Mailing.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
	Mailing.hasMany(MailJob, { foreignKey: 'mailingId', as: 'jobs' });
	MailJob.belongsTo(Mailing, { foreignKey: 'mailingId', as: 'mailing' });
	MailJob.belongsTo(Subscriber, { foreignKey: 'subscriberId', as: 'subscriber' });
}
