/*
 * Shapes the editor components receive. Declared here rather than imported from
 * $lib/server so client code never depends on a server module, even for types.
 */
import type { PartCategory, TaxMode } from '$lib/domain/types';

/** Field name → messages, as the actions return them (`spec.<path>` for spec fields). */
export type Issues = Record<string, string[]>;

export interface EditorPartRow {
	id: number;
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	updatedAt: string;
}

export interface EditorRegionOption {
	code: string;
	name: string;
	currency: string;
	taxMode: TaxMode;
}

export interface EditorStoreRow {
	id: number;
	name: string;
	url: string;
	region: { code: string; name: string; currency: string };
	quoteCount: number;
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
	source: string;
}

export interface ImportProblemRow {
	row: number;
	column: string | null;
	reason: string;
}

/** Messages for one field, and the ids that tie them to their control. */
export function describedBy(
	id: string,
	issues: string[] | undefined,
	hintId?: string
): string | undefined {
	return (
		[hintId, issues?.length ? `${id}-issues` : undefined].filter(Boolean).join(' ') || undefined
	);
}
