/*
 * The editor's catalog pages: parts, stores, quotes, region choices and CSV import problems.
 * Types only.
 */
import type { PartCategory, QuoteSource, TaxMode, QuoteStatus } from '$lib/domain/types';

/** A part in the editor's lists. */
export interface EditorPartRow {
	id: number;
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	updatedAt: string;
}

export interface EditorPartDetail extends EditorPartRow {
	specs: Record<string, unknown>;
}

export interface EditorStoreRow {
	id: number;
	name: string;
	url: string;
	region: { code: string; name: string; currency: string };
	quoteCount: number;
}

export interface EditorRegionOption {
	code: string;
	name: string;
	currency: string;
	taxMode: TaxMode;
}

export interface EditorQuoteRow {
	id: number;
	part: { slug: string; brand: string; model: string };
	store: string;
	regionCode: string;
	amountMinor: number;
	shippingMinor: number;
	currency: string;
	taxIncluded: boolean;
	observedAt: string;
	source: QuoteSource;
	/** 'withdrawn': the store no longer sells the part at this price; kept for the history. */
	status: QuoteStatus;
}

/** A column of the catalog CSV (services/catalog-csv-check.ts CSV_COLUMNS). */
export type CsvColumn = 'category' | 'brand' | 'model' | 'slug' | 'specs_json';

/** One reason a row (or the whole file, row 0 / column null) cannot be imported. */
export interface ImportProblem {
	/** Spreadsheet row number: the header is row 1, the first part row 2. 0 for the whole file. */
	row: number;
	column: CsvColumn | null;
	reason: string;
}

export interface ImportRowSummary {
	row: number;
	category: string;
	brand: string;
	model: string;
	slug: string;
	action: 'create' | 'update' | 'unchanged';
}

export interface ImportPreview {
	id: string;
	fileName: string;
	rowCount: number;
	creates: number;
	updates: number;
	unchanged: number;
	rows: ImportRowSummary[];
	expiresAt: string;
}
