import type { Sequelize } from 'sequelize';
import { Account, initAccount } from './Account.js';
import { applyAssociations } from './associations.js';
import { AuditEvent, initAuditEvent } from './AuditEvent.js';
import { AuthorRequest, initAuthorRequest } from './AuthorRequest.js';
import { Build, initBuild } from './Build.js';
import { BuildSlot, initBuildSlot } from './BuildSlot.js';
import { BuildStageTick, initBuildStageTick } from './BuildStageTick.js';
import { BuildSync, initBuildSync } from './BuildSync.js';
import { CatalogImport, initCatalogImport } from './CatalogImport.js';
import { CautionRule, initCautionRule } from './CautionRule.js';
import { ContentReport, initContentReport } from './ContentReport.js';
import { EmailToken, initEmailToken } from './EmailToken.js';
import { FrameResult, initFrameResult } from './FrameResult.js';
import { Follow, initFollow } from './Follow.js';
import { Mailing, initMailing } from './Mailing.js';
import { MailJob, initMailJob } from './MailJob.js';
import { Notice, initNotice } from './Notice.js';
import { NoticeSetting, initNoticeSetting } from './NoticeSetting.js';
import { Subscriber, initSubscriber } from './Subscriber.js';
import { FxRate, initFxRate } from './FxRate.js';
import { GalleryPhoto, initGalleryPhoto } from './GalleryPhoto.js';
import { Guide, initGuide } from './Guide.js';
import { GuidePriceProposal, initGuidePriceProposal } from './GuidePriceProposal.js';
import { GuideRevision, initGuideRevision } from './GuideRevision.js';
import { GuideSlot, initGuideSlot } from './GuideSlot.js';
import { Part, initPart } from './Part.js';
import { Photo, initPhoto } from './Photo.js';
import { PaymentEvent, initPaymentEvent } from './PaymentEvent.js';
import { PriceSighting, initPriceSighting } from './PriceSighting.js';
import { PriceSightingReport, initPriceSightingReport } from './PriceSightingReport.js';
import { Quote, initQuote } from './Quote.js';
import { Region, initRegion } from './Region.js';
import { Review, initReview } from './Review.js';
import { RegionTaxRate, initRegionTaxRate } from './RegionTaxRate.js';
import { Session, initSession } from './Session.js';
import { SlotAlternate, initSlotAlternate } from './SlotAlternate.js';
import { Store, initStore } from './Store.js';
import { ThermalResult, initThermalResult } from './ThermalResult.js';
import { Tip, initTip } from './Tip.js';
import { TipSettings, initTipSettings } from './TipSettings.js';
import { User, initUser } from './User.js';
import { VerificationToken, initVerificationToken } from './VerificationToken.js';

export {
	Account,
	AuditEvent,
	AuthorRequest,
	Build,
	BuildSlot,
	BuildStageTick,
	BuildSync,
	CatalogImport,
	CautionRule,
	ContentReport,
	EmailToken,
	FrameResult,
	FxRate,
	GalleryPhoto,
	Guide,
	GuidePriceProposal,
	GuideRevision,
	GuideSlot,
	Part,
	Photo,
	PaymentEvent,
	PriceSighting,
	PriceSightingReport,
	Quote,
	Region,
	RegionTaxRate,
	Review,
	Session,
	SlotAlternate,
	Store,
	ThermalResult,
	Tip,
	TipSettings,
	User,
	VerificationToken,
	Follow,
	Mailing,
	MailJob,
	Notice,
	NoticeSetting,
	Subscriber
};

export function initModels(sequelize: Sequelize) {
	initUser(sequelize);
	initRegion(sequelize);
	initFxRate(sequelize);
	initPart(sequelize);
	initStore(sequelize);
	initQuote(sequelize);
	initGuide(sequelize);
	initGuideRevision(sequelize);
	initGuideSlot(sequelize);
	initSlotAlternate(sequelize);
	initAccount(sequelize);
	initSession(sequelize);
	initVerificationToken(sequelize);
	initEmailToken(sequelize);
	initAuditEvent(sequelize);
	initAuthorRequest(sequelize);
	initCatalogImport(sequelize);
	initRegionTaxRate(sequelize);
	initFrameResult(sequelize);
	initThermalResult(sequelize);
	initReview(sequelize);
	initContentReport(sequelize);
	initPriceSighting(sequelize);
	initPriceSightingReport(sequelize);
	initCautionRule(sequelize);
	initBuild(sequelize);
	initBuildSlot(sequelize);
	initBuildSync(sequelize);
	initPhoto(sequelize);
	initGalleryPhoto(sequelize);
	initBuildStageTick(sequelize);
	initTip(sequelize);
	initPaymentEvent(sequelize);
	initTipSettings(sequelize);
	initGuidePriceProposal(sequelize);
	initFollow(sequelize);
	initMailing(sequelize);
	initMailJob(sequelize);
	initNotice(sequelize);
	initNoticeSetting(sequelize);
	initSubscriber(sequelize);
	applyAssociations();
}
export type { StoredVariant } from './Photo.js';
