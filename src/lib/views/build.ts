/*
 * Builds, as the build services return them and the build pages show them. Types only:
 * components import them with `import type` (model instances never leave services).
 */
import type { Finding, FindingCounts } from '$lib/domain/fit';
import type { PowerBudget } from '$lib/domain/power';
import type { ValueSummary } from '$lib/domain/value';
import type { ConflictKind, SyncChoice, SyncStatus } from '$lib/domain/sync';
import type { Money, PartCategory } from '$lib/domain/types';
import type { PartRef, PriceLine, RegionSummary } from './guide';

export type BuildVisibility = 'private' | 'unlisted' | 'public';
export type BuildSlotOrigin = 'source' | 'alternate' | 'custom';

/**
 * A unit price in the build's region. Same shape as PriceLine, plus `override`: the
 * reader's own price (store, date) in the region's currency, which replaces the quote or
 * estimate for the slot's current part.
 */
export interface BuildPriceLine extends Omit<PriceLine, 'status'> {
	status: PriceLine['status'] | 'override';
}

export interface BuildOptionView {
	part: PartRef;
	/** source_pick: the base revision's pick for this slot; alternate: one of its ranked alternates. */
	kind: 'source_pick' | 'alternate';
	/** 0 for the source pick; the alternate's rank otherwise. */
	rank: number;
	reasonTag: string | null;
	note: string;
	price: PriceLine | null;
	/** No conflict in the build's fit report with this option swapped into the slot. */
	fits: boolean;
}

export interface BuildSlotView {
	id: number;
	sourceSlotKey: string | null;
	category: PartCategory;
	label: string;
	position: number;
	quantity: number;
	origin: BuildSlotOrigin;
	part: PartRef;
	/** Unit price in the build region; an override in the region's currency wins (status 'override'). */
	price: BuildPriceLine | null;
	lineTotal: Money | null;
	/** The reader's price. `applied` is false when it is in another currency than the region's (the region changed since). */
	override: { amount: Money; store: string; date: string; applied: boolean } | null;
	/** Owner only; others see `{ purchased: false, paid: null, purchasedAt: null, store: null }`. */
	purchase: {
		purchased: boolean;
		paid: Money | null;
		purchasedAt: string | null;
		store: string | null;
	};
	options: BuildOptionView[];
}

export interface BuildSourceView {
	slug: string;
	title: string;
	authorName: string;
	baseRevisionNumber: number | null;
	/** The guide's published revision now; null when the guide is no longer published. */
	latestRevisionNumber: number | null;
	newerRevisionAvailable: boolean;
}

export interface BuildTotals {
	/** Sum of the priced line totals (unpriced slots are counted in `unpricedSlots`, not as zero). */
	planned: Money;
	/** Paid amounts of bought slots (the line total where no amount was entered). Owner only: 0 for others. */
	spent: Money;
	/** Planned line totals of the slots not bought yet. */
	remainingToBuy: Money;
	/** budget − (spent + remainingToBuy); negative when over budget; null without a budget (or for non-owners). */
	leftOfBudget: Money | null;
	unpricedSlots: number;
	boughtCount: number;
}

export interface ValueView extends ValueSummary {
	/** The total the value is worked out against; null when a line is unpriced. */
	total: Money | null;
}

export interface DriftView {
	/** Stable within the page: the source slot's key, or the reader's own slot's id. */
	key: string;
	/** Display only: labels may repeat. */
	label: string;
	kind: 'same' | 'swapped' | 'quantity' | 'added' | 'removed';
	/** swapped/removed: the source's part ("Brand Model", "× n" when n > 1); quantity: the source's quantity. */
	from?: string;
	/** swapped/added: the build's part; quantity: the build's quantity. */
	to?: string;
}

export interface BuildView {
	id: number;
	title: string;
	ownerName: string;
	isOwner: boolean;
	visibility: BuildVisibility;
	/** Owner only. */
	shareToken: string | null;
	/** The owner's notes; empty for others (a build's notes are the owner's own). */
	notes: string;
	version: number;
	notifyOnNewRevision: boolean;
	region: RegionSummary;
	/** Owner only. */
	budget: Money | null;
	source: BuildSourceView | null;
	slots: BuildSlotView[];
	totals: BuildTotals;
	/** Keys of findings and slotLabels: String(slot.id). */
	fit: { findings: Finding[]; summary: FindingCounts; slotLabels: Record<string, string> };
	power: PowerBudget;
	drift: DriftView[];
	value: { build: ValueView | null; source: ValueView | null; sourceResultsDiffer: boolean };
	/** Oldest exchange-rate date behind an estimate; null when none was needed. */
	ratesAsOf: string | null;
	updatedAt: string;
	/** Set while the editors hide the build (only its owner and editors get such a build). */
	hidden?: { reason: string; hiddenAt: string } | null;
}

export interface BuildCard {
	id: number;
	title: string;
	visibility: BuildVisibility;
	region: RegionSummary;
	source: { slug: string; title: string } | null;
	slotCount: number;
	boughtCount: number;
	newerRevisionAvailable: boolean;
	/** Set while an editor has hidden the build after a report: the reason its owner is shown. */
	hiddenReason: string | null;
	updatedAt: string;
}

export interface LineageView {
	/** Every fork of the guide (any visibility: a count reveals nothing about one reader). */
	forkCount: number;
	/** Public forks only, most recently changed first. */
	publicBuilds: { id: number; title: string; ownerName: string; updatedAt: string }[];
}

/** One side of a sync row: the part, how many, and the slot's label on that side. */
export interface SyncSideView {
	part: PartRef;
	quantity: number;
	label: string;
}

export interface SyncRowView {
	/** Row id for choices (`source:<key>` or `local:<build slot id>`). */
	id: string;
	status: SyncStatus;
	conflict: ConflictKind | null;
	/** The label to show: the build's, else upstream's, else the base's. */
	label: string;
	category: PartCategory;
	/** The build slot this row is about, if the build has one. */
	slotId: number | null;
	base: SyncSideView | null;
	upstream: SyncSideView | null;
	local: SyncSideView | null;
	options: SyncChoice[];
	defaultTakeAll: SyncChoice | null;
	defaultKeep: SyncChoice | null;
}

export interface LastSyncView {
	id: number;
	fromRevisionNumber: number | null;
	toRevisionNumber: number | null;
	createdAt: string;
}

export interface SyncPlanView {
	buildId: number;
	version: number;
	guide: { slug: string; title: string };
	base: { revisionId: number; number: number };
	upstream: { revisionId: number; number: number; publishedAt: string | null };
	rows: SyncRowView[];
	/** Row ids that need a choice. */
	conflicts: string[];
	/** Rows where taking upstream would change the build. */
	offered: number;
	/** The sync that undo would revert, if any. */
	lastSync: LastSyncView | null;
	/** When the owner declined this very revision ("Not now"), else null; it stays offered. */
	declinedAt: string | null;
}

export interface BudgetSwapView {
	slotId: number;
	label: string;
	from: { part: PartRef; price: Money };
	to: { part: PartRef; price: Money };
	/** to − from, line prices (negative saves money). */
	delta: Money;
}

export interface BudgetProposal {
	kind: 'proposal';
	budget: Money;
	/** The build's total now, with the same prices. */
	currentTotal: Money;
	/** The total after the swaps (at most the budget). */
	total: Money;
	changes: number;
	swaps: BudgetSwapView[];
}

export type NoFitCode = 'over_budget' | 'no_conflict_free_combination' | 'unpriced';

export interface BudgetNoFit {
	kind: 'no_fit';
	code: NoFitCode;
	/** A sentence for the reader. */
	reason: string;
	budget: Money;
	/** Cheapest total without a conflict, when there is one. */
	cheapestTotal?: Money;
}
