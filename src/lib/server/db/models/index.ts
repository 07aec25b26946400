import type { Sequelize } from 'sequelize';
import { Account, initAccount } from './Account.js';
import { applyAssociations } from './associations.js';
import { AuditEvent, initAuditEvent } from './AuditEvent.js';
import { AuthorRequest, initAuthorRequest } from './AuthorRequest.js';
import { CatalogImport, initCatalogImport } from './CatalogImport.js';
import { EmailToken, initEmailToken } from './EmailToken.js';
import { FrameResult, initFrameResult } from './FrameResult.js';
import { FxRate, initFxRate } from './FxRate.js';
import { Guide, initGuide } from './Guide.js';
import { GuideRevision, initGuideRevision } from './GuideRevision.js';
import { GuideSlot, initGuideSlot } from './GuideSlot.js';
import { Part, initPart } from './Part.js';
import { Quote, initQuote } from './Quote.js';
import { Region, initRegion } from './Region.js';
import { RegionTaxRate, initRegionTaxRate } from './RegionTaxRate.js';
import { Session, initSession } from './Session.js';
import { SlotAlternate, initSlotAlternate } from './SlotAlternate.js';
import { Store, initStore } from './Store.js';
import { ThermalResult, initThermalResult } from './ThermalResult.js';
import { User, initUser } from './User.js';
import { VerificationToken, initVerificationToken } from './VerificationToken.js';

export {
	Account,
	AuditEvent,
	AuthorRequest,
	CatalogImport,
	EmailToken,
	FrameResult,
	FxRate,
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	RegionTaxRate,
	Session,
	SlotAlternate,
	Store,
	ThermalResult,
	User,
	VerificationToken
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
	applyAssociations();
}
