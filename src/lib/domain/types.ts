/**
 * Shared vocabulary of Slotwise (see docs/architecture.md "Our words").
 * Plain types only: no framework, database or environment imports.
 */

/** Catalog categories; each has its own spec schema in $lib/schemas/part-specs. */
export const PART_CATEGORIES = [
	'cpu',
	'cooler',
	'motherboard',
	'memory',
	'storage',
	'gpu',
	'psu',
	'case',
	'fan',
	'os',
	'extra'
] as const;
export type PartCategory = (typeof PART_CATEGORIES)[number];

/** Human labels for slot categories, in the order a build is usually listed. */
export const CATEGORY_LABELS: Record<PartCategory, string> = {
	cpu: 'CPU',
	cooler: 'CPU cooler',
	motherboard: 'Motherboard',
	memory: 'Memory',
	storage: 'Storage',
	gpu: 'Graphics card',
	psu: 'Power supply',
	case: 'Case',
	fan: 'Case fans',
	os: 'Operating system',
	extra: 'Extras'
};

export const ROLES = ['reader', 'author', 'editor', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const GUIDE_STATES = [
	'draft',
	'in_review',
	'changes_requested',
	'published',
	'declined',
	'archived'
] as const;
export type GuideState = (typeof GUIDE_STATES)[number];

export const ALTERNATE_REASONS = [
	'lower_price',
	'easier_to_find',
	'upgrade_path',
	'quieter',
	'looks'
] as const;
export type AlternateReason = (typeof ALTERNATE_REASONS)[number];

export const ALTERNATE_REASON_LABELS: Record<AlternateReason, string> = {
	lower_price: 'Lower price',
	easier_to_find: 'Easier to find',
	upgrade_path: 'Upgrade path',
	quieter: 'Quieter',
	looks: 'Looks'
};

/** Whether a region's shelf prices include tax (EU, UK, JP) or are shown pre-tax (US). */
export const TAX_MODES = ['inclusive', 'exclusive'] as const;
export type TaxMode = (typeof TAX_MODES)[number];

export const QUOTE_STATUSES = ['active', 'stale', 'withdrawn'] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];

export const QUOTE_SOURCES = ['author', 'editor', 'sighting', 'import'] as const;
export type QuoteSource = (typeof QUOTE_SOURCES)[number];

/** An amount of money: integer minor units plus an ISO 4217 code. Never a float. */
export interface Money {
	amountMinor: number;
	currency: string;
}
