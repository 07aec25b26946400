import type { Sequelize } from 'sequelize';
import { applyAssociations } from './associations.js';
import { FxRate, initFxRate } from './FxRate.js';
import { Guide, initGuide } from './Guide.js';
import { GuideRevision, initGuideRevision } from './GuideRevision.js';
import { GuideSlot, initGuideSlot } from './GuideSlot.js';
import { Part, initPart } from './Part.js';
import { Quote, initQuote } from './Quote.js';
import { Region, initRegion } from './Region.js';
import { SlotAlternate, initSlotAlternate } from './SlotAlternate.js';
import { Store, initStore } from './Store.js';
import { User, initUser } from './User.js';

export { FxRate, Guide, GuideRevision, GuideSlot, Part, Quote, Region, SlotAlternate, Store, User };

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
	applyAssociations();
}
