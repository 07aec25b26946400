/*
 * The ordered list of migrations. Listed by hand (not globbed) so the same list works
 * under Vite, vitest and tsx alike. Names are the file names, in timestamp order: add a
 * new one at the end (import and entry, each entry with its trailing comma);
 * tests/unit/repository.spec.ts checks the list against the folder, in timestamp order.
 */
import type { MigrationModule } from '../umzug.js';
import * as m00 from './2026.12.01T10.00.00.create-users.js';
import * as m01 from './2026.12.01T10.01.00.create-regions.js';
import * as m02 from './2026.12.01T10.02.00.create-fx-rates.js';
import * as m03 from './2026.12.01T10.03.00.create-parts.js';
import * as m04 from './2026.12.01T10.04.00.create-stores.js';
import * as m05 from './2026.12.01T10.05.00.create-quotes.js';
import * as m06 from './2026.12.01T10.06.00.create-guides.js';
import * as m07 from './2026.12.01T10.07.00.create-guide-revisions.js';
import * as m08 from './2026.12.01T10.08.00.add-guides-published-revision-fk.js';
import * as m09 from './2026.12.01T10.09.00.create-guide-slots.js';
import * as m10 from './2026.12.01T10.10.00.create-slot-alternates.js';
import * as m11 from './2026.12.02T09.00.00.add-users-session-version.js';
import * as m12 from './2026.12.02T09.01.00.add-users-disabled-at.js';
import * as m13 from './2026.12.02T09.02.00.create-accounts.js';
import * as m14 from './2026.12.02T09.03.00.create-sessions.js';
import * as m15 from './2026.12.02T09.04.00.create-verification-tokens.js';
import * as m16 from './2026.12.02T09.05.00.create-audit-events.js';
import * as m17 from './2026.12.02T09.06.00.create-author-requests.js';
import * as m18 from './2026.12.02T09.07.00.create-rate-limits.js';
import * as m19 from './2026.12.02T09.08.00.create-email-tokens.js';
import * as mEmailChange from './2026.12.02T09.09.00.add-email-tokens-new-email.js';
import * as mCatalogImports from './2026.12.03T14.00.00.create-catalog-imports.js';
import * as mRegionTaxRates from './2026.12.03T14.01.00.create-region-tax-rates.js';
import * as mGuidesDisclosure from './2026.12.02T12.00.00.add-guides-disclosure.js';
import * as mGuidesDisclosureNote from './2026.12.02T12.00.01.add-guides-disclosure-note.js';
import * as mGuidesWalkthroughUrl from './2026.12.02T12.00.02.add-guides-walkthrough-url.js';
import * as mFrameResults from './2026.12.04T10.00.00.create-frame-results.js';
import * as mThermalResults from './2026.12.04T10.01.00.create-thermal-results.js';
import * as mContentReports from './2026.12.05T11.00.00.create-content-reports.js';
import * as mGuidesHiddenAt from './2026.12.05T11.01.00.add-guides-hidden-at.js';
import * as mGuidesHiddenReason from './2026.12.05T11.02.00.add-guides-hidden-reason.js';
import * as mGuidesHiddenBy from './2026.12.05T11.03.00.add-guides-hidden-by.js';
import * as mReviews from './2026.12.05T09.00.00.create-reviews.js';
import * as mPriceSightings from './2026.12.05T10.00.00.create-price-sightings.js';
import * as mPriceSightingReports from './2026.12.05T10.01.00.create-price-sighting-reports.js';
import * as mCautionRules from './2026.12.05T12.00.00.create-caution-rules.js';
import * as mBuilds from './2026.12.06T09.00.00.create-builds.js';
import * as mBuildsHiddenAt from './2026.12.06T10.00.00.add-builds-hidden-at.js';
import * as mBuildsHiddenReason from './2026.12.06T10.01.00.add-builds-hidden-reason.js';
import * as mBuildsHiddenBy from './2026.12.06T10.02.00.add-builds-hidden-by.js';
import * as mPhotos from './2026.12.08T09.00.00.create-photos.js';
import * as mGalleryPhotos from './2026.12.08T09.01.00.create-gallery-photos.js';
import * as mBuildStageTicks from './2026.12.08T09.02.00.create-build-stage-ticks.js';
import * as mTips from './2026.12.09T09.00.00.create-tips.js';
import * as mPaymentEvents from './2026.12.09T09.01.00.create-payment-events.js';
import * as mTipSettings from './2026.12.09T09.02.00.create-tip-settings.js';
import * as mRevisionDetails from './2026.12.09T10.00.00.add-guide-revisions-details.js';
import * as mPriceProposals from './2026.12.09T10.01.00.create-guide-price-proposals.js';
import * as mGuideSlotsSlotKey from './2026.12.09T11.00.00.add-guide-slots-slot-key.js';
import * as mGuideSlotsSlotKeyIndex from './2026.12.09T11.01.00.add-guide-slots-revision-slot-key-index.js';
import * as mBuildSlotsRekey from './2026.12.09T11.02.00.rekey-build-slots-source-slot-key.js';
import * as mGuideRegionPrices from './2026.12.09T12.00.00.create-guide-region-prices.js';
import * as mUsersHandle from './2026.12.10T10.00.00.add-users-handle.js';
import * as mUsersBio from './2026.12.10T10.01.00.add-users-bio.js';
import * as mFillUsersHandle from './2026.12.10T10.02.00.fill-users-handle.js';
import * as mRequireUsersHandle from './2026.12.10T10.03.00.require-users-handle.js';
import * as mRevisionsMajor from './2026.12.10T10.04.00.add-guide-revisions-major.js';
import * as mFollows from './2026.12.10T10.05.00.create-follows.js';
import * as mSubscribers from './2026.12.10T10.06.00.create-subscribers.js';
import * as mNotices from './2026.12.10T10.07.00.create-notices.js';
import * as mNoticeSettings from './2026.12.10T10.08.00.create-notice-settings.js';
import * as mMailings from './2026.12.10T10.09.00.create-mailings.js';
import * as mMailJobs from './2026.12.10T10.10.00.create-mail-jobs.js';
import * as mCacheGenerations from './2026.12.11T10.00.00.create-cache-generations.js';
import * as mPartsFulltext from './2026.12.11T11.00.00.add-parts-brand-model-fulltext.js';
import * as mPartsBrandModel from './2026.12.11T11.01.00.add-parts-brand-model-index.js';
import * as mPartsModel from './2026.12.11T11.02.00.add-parts-model-index.js';
import * as mPartsCategoryBrandModel from './2026.12.11T11.03.00.add-parts-category-brand-model-index.js';
import * as mQuotesLatestActive from './2026.12.11T11.04.00.add-quotes-latest-active-index.js';
import * as mRevisionsFulltext from './2026.12.11T11.05.00.add-guide-revisions-text-fulltext.js';
import * as mGuidesListing from './2026.12.11T11.06.00.add-guides-listing-index.js';
import * as mGuidesTitle from './2026.12.11T11.07.00.add-guides-title-index.js';
import * as mPricesTotalNewest from './2026.12.11T11.08.00.add-guide-region-prices-total-newest-index.js';
import * as mUpkeepBaselines from './2026.12.12T10.00.00.create-guide-upkeep-baselines.js';
import * as mUpkeepAlerts from './2026.12.12T10.01.00.create-guide-upkeep-alerts.js';
import * as mUsersUpkeepDigest from './2026.12.12T10.02.00.add-users-upkeep-digest.js';
import * as mTipsNoteHiddenReason from './2026.12.13T10.00.00.add-tips-note-hidden-reason.js';
import * as mGuideTags from './2026.12.14T10.00.00.create-guide-tags.js';
import * as mPhotosProcessing from './2026.12.14T11.00.00.add-photos-processing.js';
import * as mUpkeepDigests from './2026.12.14T12.00.00.create-upkeep-digests.js';
import * as mUpkeepAlertsDigestId from './2026.12.14T12.01.00.add-guide-upkeep-alerts-digest-id.js';
import * as mUsersUpkeepDigestSince from './2026.12.14T12.02.00.add-users-upkeep-digest-since.js';
import * as mScheduledRuns from './2026.12.14T12.03.00.create-scheduled-runs.js';
import * as mBuildUpdateDeclines from './2026.12.14T12.04.00.create-build-update-declines.js';
import * as mPartRegionPrices from './2026.12.15T10.00.00.create-part-region-prices.js';
import * as mPartRegionPriceRefresh from './2026.12.15T10.01.00.create-part-region-price-refresh.js';
import * as mQuotesInsertPartPrice from './2026.12.15T10.02.00.add-quotes-insert-part-price-trigger.js';
import * as mQuotesUpdatePartPrice from './2026.12.15T10.03.00.add-quotes-update-part-price-trigger.js';
import * as mQuotesDeletePartPrice from './2026.12.15T10.04.00.add-quotes-delete-part-price-trigger.js';
import * as mRegionsTaxPartPrice from './2026.12.15T10.05.00.add-regions-tax-part-price-trigger.js';
import * as mPartsCopyPartPrice from './2026.12.15T10.06.00.add-parts-copy-part-price-trigger.js';
import * as mBackfillPartRegionPrices from './2026.12.15T10.07.00.backfill-part-region-prices.js';
import * as mUsersUpkeepMoveThreshold from './2026.12.16T10.00.00.add-users-upkeep-move-threshold.js';

export const migrations: Record<string, MigrationModule> = {
	'2026.12.01T10.00.00.create-users': m00,
	'2026.12.01T10.01.00.create-regions': m01,
	'2026.12.01T10.02.00.create-fx-rates': m02,
	'2026.12.01T10.03.00.create-parts': m03,
	'2026.12.01T10.04.00.create-stores': m04,
	'2026.12.01T10.05.00.create-quotes': m05,
	'2026.12.01T10.06.00.create-guides': m06,
	'2026.12.01T10.07.00.create-guide-revisions': m07,
	'2026.12.01T10.08.00.add-guides-published-revision-fk': m08,
	'2026.12.01T10.09.00.create-guide-slots': m09,
	'2026.12.01T10.10.00.create-slot-alternates': m10,
	'2026.12.02T09.00.00.add-users-session-version': m11,
	'2026.12.02T09.01.00.add-users-disabled-at': m12,
	'2026.12.02T09.02.00.create-accounts': m13,
	'2026.12.02T09.03.00.create-sessions': m14,
	'2026.12.02T09.04.00.create-verification-tokens': m15,
	'2026.12.02T09.05.00.create-audit-events': m16,
	'2026.12.02T09.06.00.create-author-requests': m17,
	'2026.12.02T09.07.00.create-rate-limits': m18,
	'2026.12.02T09.08.00.create-email-tokens': m19,
	'2026.12.02T09.09.00.add-email-tokens-new-email': mEmailChange,
	'2026.12.02T12.00.00.add-guides-disclosure': mGuidesDisclosure,
	'2026.12.02T12.00.01.add-guides-disclosure-note': mGuidesDisclosureNote,
	'2026.12.02T12.00.02.add-guides-walkthrough-url': mGuidesWalkthroughUrl,
	'2026.12.03T14.00.00.create-catalog-imports': mCatalogImports,
	'2026.12.03T14.01.00.create-region-tax-rates': mRegionTaxRates,
	'2026.12.04T10.00.00.create-frame-results': mFrameResults,
	'2026.12.04T10.01.00.create-thermal-results': mThermalResults,
	'2026.12.05T09.00.00.create-reviews': mReviews,
	'2026.12.05T10.00.00.create-price-sightings': mPriceSightings,
	'2026.12.05T10.01.00.create-price-sighting-reports': mPriceSightingReports,
	'2026.12.05T11.00.00.create-content-reports': mContentReports,
	'2026.12.05T11.01.00.add-guides-hidden-at': mGuidesHiddenAt,
	'2026.12.05T11.02.00.add-guides-hidden-reason': mGuidesHiddenReason,
	'2026.12.05T11.03.00.add-guides-hidden-by': mGuidesHiddenBy,
	'2026.12.05T12.00.00.create-caution-rules': mCautionRules,
	'2026.12.06T09.00.00.create-builds': mBuilds,
	'2026.12.06T10.00.00.add-builds-hidden-at': mBuildsHiddenAt,
	'2026.12.06T10.01.00.add-builds-hidden-reason': mBuildsHiddenReason,
	'2026.12.06T10.02.00.add-builds-hidden-by': mBuildsHiddenBy,
	'2026.12.08T09.00.00.create-photos': mPhotos,
	'2026.12.08T09.01.00.create-gallery-photos': mGalleryPhotos,
	'2026.12.08T09.02.00.create-build-stage-ticks': mBuildStageTicks,
	'2026.12.09T09.00.00.create-tips': mTips,
	'2026.12.09T09.01.00.create-payment-events': mPaymentEvents,
	'2026.12.09T09.02.00.create-tip-settings': mTipSettings,
	'2026.12.09T10.00.00.add-guide-revisions-details': mRevisionDetails,
	'2026.12.09T10.01.00.create-guide-price-proposals': mPriceProposals,
	'2026.12.09T11.00.00.add-guide-slots-slot-key': mGuideSlotsSlotKey,
	'2026.12.09T11.01.00.add-guide-slots-revision-slot-key-index': mGuideSlotsSlotKeyIndex,
	'2026.12.09T11.02.00.rekey-build-slots-source-slot-key': mBuildSlotsRekey,
	'2026.12.09T12.00.00.create-guide-region-prices': mGuideRegionPrices,
	'2026.12.10T10.00.00.add-users-handle': mUsersHandle,
	'2026.12.10T10.01.00.add-users-bio': mUsersBio,
	'2026.12.10T10.02.00.fill-users-handle': mFillUsersHandle,
	'2026.12.10T10.03.00.require-users-handle': mRequireUsersHandle,
	'2026.12.10T10.04.00.add-guide-revisions-major': mRevisionsMajor,
	'2026.12.10T10.05.00.create-follows': mFollows,
	'2026.12.10T10.06.00.create-subscribers': mSubscribers,
	'2026.12.10T10.07.00.create-notices': mNotices,
	'2026.12.10T10.08.00.create-notice-settings': mNoticeSettings,
	'2026.12.10T10.09.00.create-mailings': mMailings,
	'2026.12.10T10.10.00.create-mail-jobs': mMailJobs,
	'2026.12.11T10.00.00.create-cache-generations': mCacheGenerations,
	'2026.12.11T11.00.00.add-parts-brand-model-fulltext': mPartsFulltext,
	'2026.12.11T11.01.00.add-parts-brand-model-index': mPartsBrandModel,
	'2026.12.11T11.02.00.add-parts-model-index': mPartsModel,
	'2026.12.11T11.03.00.add-parts-category-brand-model-index': mPartsCategoryBrandModel,
	'2026.12.11T11.04.00.add-quotes-latest-active-index': mQuotesLatestActive,
	'2026.12.11T11.05.00.add-guide-revisions-text-fulltext': mRevisionsFulltext,
	'2026.12.11T11.06.00.add-guides-listing-index': mGuidesListing,
	'2026.12.11T11.07.00.add-guides-title-index': mGuidesTitle,
	'2026.12.11T11.08.00.add-guide-region-prices-total-newest-index': mPricesTotalNewest,
	'2026.12.12T10.00.00.create-guide-upkeep-baselines': mUpkeepBaselines,
	'2026.12.12T10.01.00.create-guide-upkeep-alerts': mUpkeepAlerts,
	'2026.12.12T10.02.00.add-users-upkeep-digest': mUsersUpkeepDigest,
	'2026.12.13T10.00.00.add-tips-note-hidden-reason': mTipsNoteHiddenReason,
	'2026.12.14T10.00.00.create-guide-tags': mGuideTags,
	'2026.12.14T11.00.00.add-photos-processing': mPhotosProcessing,
	'2026.12.14T12.00.00.create-upkeep-digests': mUpkeepDigests,
	'2026.12.14T12.01.00.add-guide-upkeep-alerts-digest-id': mUpkeepAlertsDigestId,
	'2026.12.14T12.02.00.add-users-upkeep-digest-since': mUsersUpkeepDigestSince,
	'2026.12.14T12.03.00.create-scheduled-runs': mScheduledRuns,
	'2026.12.14T12.04.00.create-build-update-declines': mBuildUpdateDeclines,
	'2026.12.15T10.00.00.create-part-region-prices': mPartRegionPrices,
	'2026.12.15T10.01.00.create-part-region-price-refresh': mPartRegionPriceRefresh,
	'2026.12.15T10.02.00.add-quotes-insert-part-price-trigger': mQuotesInsertPartPrice,
	'2026.12.15T10.03.00.add-quotes-update-part-price-trigger': mQuotesUpdatePartPrice,
	'2026.12.15T10.04.00.add-quotes-delete-part-price-trigger': mQuotesDeletePartPrice,
	'2026.12.15T10.05.00.add-regions-tax-part-price-trigger': mRegionsTaxPartPrice,
	'2026.12.15T10.06.00.add-parts-copy-part-price-trigger': mPartsCopyPartPrice,
	'2026.12.15T10.07.00.backfill-part-region-prices': mBackfillPartRegionPrices,
	'2026.12.16T10.00.00.add-users-upkeep-move-threshold': mUsersUpkeepMoveThreshold
};
