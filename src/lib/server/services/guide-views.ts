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
	/** Shelf price for one unit in the base region, as quoted. */
	unit: Money;
	storeName: string;
	observedAt: string; // ISO date
	taxIncluded: boolean;
}

export interface PartRef {
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
