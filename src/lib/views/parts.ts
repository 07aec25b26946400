/*
 * The public parts catalog, as the parts pages and GET /api/v1/parts show it. Types only.
 */
import type { Money, PartCategory, QuoteStatus } from '$lib/domain/types';
import type { PriceLine, RegionSummary } from './guide';

export interface PartSummary {
	/** The id the draft, build and fit APIs take (`partId`, `pickPartId`); the pickers post it. */
	id: number;
	slug: string;
	category: PartCategory;
	brand: string;
	model: string;
	/** As stored: validated against the category's spec schema on every write. */
	specs: Record<string, unknown>;
}

/** A catalog row: the part and, with a region chosen, its price there. */
export interface PartListItem extends PartSummary {
	/**
	 * The part's latest active store quote in the chosen region, in the region's display
	 * convention (the pricing service's figure); null without a region or without a quote there.
	 */
	price: PriceLine | null;
}

/** GET /api/v1/parts */
export interface PartSearchResult {
	items: PartListItem[];
	/** The region the prices are in; null when none was chosen. */
	region: RegionSummary | null;
	total: number;
	/** The page shown: a page past the end gives the last page. */
	page: number;
	pageCount: number;
}

export interface StoreQuote {
	storeName: string;
	storeUrl: string;
	/** Shelf price as the store showed it, in the quote's currency. */
	price: Money;
	shipping: Money;
	taxIncluded: boolean;
	observedAt: string; // ISO 8601
	/** The product page, when the quote recorded one. */
	url: string | null;
	status: QuoteStatus;
}

export interface RegionQuotes {
	region: RegionSummary;
	/** The latest quote of each store in the region, cheapest first. */
	quotes: StoreQuote[];
}

export interface PricePoint {
	observedAt: string; // ISO 8601
	amountMinor: number;
}

/** Every quote of one store in one region, oldest first: one line of the history chart. */
export interface PriceSeries {
	regionCode: string;
	regionName: string;
	storeName: string;
	currency: string;
	points: PricePoint[];
}

export interface GuideUse {
	role: 'pick' | 'alternate';
	slotLabel: string;
	/** The alternate's rank in its slot (1 = first fallback); null for a pick. */
	rank: number | null;
}

export interface GuideUsingPart {
	slug: string;
	title: string;
	uses: GuideUse[];
}

/** GET /api/v1/parts/[slug] */
export interface PartDetail extends PartSummary {
	quotesByRegion: RegionQuotes[];
	history: PriceSeries[];
	guides: GuideUsingPart[];
}
