/*
 * Shapes of the invented demo scenario. Everything here is fictional: brands, parts,
 * stores, people and game titles are made up; only the standards (sockets, DDR5, ATX,
 * PCIe generations, 80 PLUS levels) are real. Relative imports only: scripts/seed.ts
 * runs this outside Vite.
 */
import type { AlternateReason, PartCategory, Role, TaxMode } from '../../../../domain/types';

export interface DemoUser {
	email: string;
	name: string;
	role: Role;
}

export interface DemoRegion {
	code: string; // lower-case, e.g. 'us'
	name: string;
	currency: string; // ISO 4217
	taxMode: TaxMode;
	/** Tax rate in basis points (1900 = 19 %). */
	taxRateBp: number;
	/** Market factor per category in basis points (10000 = same as converted base price). */
	categoryFactorsBp: Partial<Record<PartCategory, number>>;
}

export interface DemoStore {
	name: string;
	regionCode: string;
	url: string; // https://….example
}

export interface DemoPart {
	slug: string;
	category: PartCategory;
	brand: string;
	model: string;
	specs: Record<string, unknown>; // validated against SPEC_SCHEMAS[category] when seeding
}

export interface DemoQuote {
	partSlug: string;
	storeName: string;
	/** Price in minor units of the store's region currency, as shown on the shelf. */
	amountMinor: number;
	shippingMinor?: number;
	/** Days before the seed date the price was observed (0 = today). */
	daysAgo: number;
}

export interface DemoAlternate {
	partSlug: string;
	reasonTag: AlternateReason;
	note: string;
}

export interface DemoSlot {
	category: PartCategory;
	label: string;
	quantity: number;
	pickSlug: string;
	reason: string;
	/** Store whose latest quote for the pick is the slot's price quote. */
	quoteStore: string;
	alternates: DemoAlternate[]; // ranked: first is rank 1
}

export interface DemoGuide {
	slug: string;
	authorEmail: string;
	title: string;
	summary: string;
	/** Target budget in minor units of the base region's currency. */
	targetBudgetMinor: number;
	baseRegionCode: string;
	tags: string[];
	featured: boolean;
	buildNotesMd: string;
	slots: DemoSlot[];
}
