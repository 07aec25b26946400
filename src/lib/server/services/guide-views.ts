/*
 * Plain shapes the guide service returns to routes (model instances never leave services).
 */
import type { AlternateReason, Money, PartCategory } from '$lib/domain/types';

export interface RegionSummary {
	code: string;
	name: string;
	currency: string;
	taxMode: 'inclusive' | 'exclusive';
	taxRateBp: number;
}

export interface GuideCard {
	slug: string;
	title: string;
	summary: string;
	authorName: string;
	targetBudget: Money;
	baseRegion: RegionSummary;
	tags: string[];
	featured: boolean;
	/** Sum of the picks' quoted prices × quantity; null when a pick has no price yet. */
	picksTotal: Money | null;
	/** Number of slots without a price (so the total is understood as partial). */
	unpricedSlots: number;
	publishedAt: string; // ISO 8601
}

export interface PriceLine {
	/** Price for one unit in the shown region's currency. */
	unit: Money;
	/** quoted: a store's price in this region; estimated: worked out from the base region's price. */
	status: 'quoted' | 'estimated';
	/** The quoting store; null for estimates. */
	storeName: string | null;
	/** quoted: the day the price was seen; estimated: the exchange rates' as-of date (null when none was needed). */
	observedAt: string | null;
	taxIncluded: boolean;
}

export interface PartRef {
	id: number;
	slug: string;
	brand: string;
	model: string;
	category: PartCategory;
}

export interface AlternateView {
	rank: number;
	part: PartRef;
	reasonTag: AlternateReason;
	note: string;
	price: PriceLine | null;
	/** Alternate unit price minus pick unit price; null when either is unpriced. */
	deltaFromPick: Money | null;
}

export interface SlotView {
	id: number;
	category: PartCategory;
	label: string;
	position: number;
	quantity: number;
	pick: PartRef;
	reason: string;
	price: PriceLine | null;
	/** unit × quantity */
	lineTotal: Money | null;
	alternates: AlternateView[];
}

export interface GuideDetail extends GuideCard {
	revisionNumber: number;
	slots: SlotView[];
	/** Min and max of the build total over each slot's pick and alternates. */
	totalRange: { min: Money; max: Money } | null;
}

/** A guide priced in a chosen region (the base region unless the reader picks another). */
export interface PricedGuide extends GuideDetail {
	/** The region the prices are shown in. */
	region: RegionSummary;
	/** Every region a reader can switch to. */
	regions: RegionSummary[];
	/** How the picks were priced in this region. */
	picks: { quoted: number; estimated: number; unpriced: number };
	/** Oldest exchange-rate date behind an estimate, and whether rates are older than 7 days. */
	ratesAsOf: string | null;
	ratesStale: boolean;
}
