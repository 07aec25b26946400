/*
 * Regions as editors keep them and as GET /api/v1/regions answers. Types only.
 */
import type { PartCategory, TaxMode } from '$lib/domain/types';

export interface TaxRateEntry {
	id: number;
	rateBp: number;
	/** 'YYYY-MM-DD' */
	effectiveFrom: string;
	note: string | null;
	recordedBy: string | null;
	/** Whether this is the rate in force today. */
	current: boolean;
	/** Whether it starts after today. */
	upcoming: boolean;
}

/** A region as editors keep it. */
export interface EditorRegion {
	code: string;
	name: string;
	currency: string;
	taxMode: TaxMode;
	/** The rate in force today, from the history (or the column when there is none). */
	taxRateBp: number;
	/** When that rate took effect; null when the region has no dated history. */
	taxRateSince: string | null;
	/** The next dated change, if one is recorded. */
	nextTaxRate: { rateBp: number; effectiveFrom: string } | null;
	/** One factor per category in basis points (10000 = ×1.00); missing ones read as 10000. */
	categoryFactorsBp: Record<PartCategory, number>;
}

export interface EditorRegionDetail extends EditorRegion {
	taxRates: TaxRateEntry[];
}

/** The public shape of GET /api/v1/regions. */
export interface PublicRegion {
	code: string;
	name: string;
	currency: string;
	taxMode: TaxMode;
	taxRateBp: number;
	taxRateSince: string | null;
	nextTaxRate: { rateBp: number; effectiveFrom: string } | null;
	categoryFactorsBp: Record<PartCategory, number>;
}
