/**
 * A build's source: the guide revision it was forked from (or last synced to), slot by slot.
 * Fork, the build page, edits, sync and within-budget all match build slots to that
 * revision's slots through the keys given here, and offer its pick and alternates per slot.
 */
import type { SourceSlot } from '$lib/domain/sync';
import type { BuildSlotOrigin } from '$lib/views';
import { loadRevisionSlots } from './revision-snapshots';
import type { LoadedRevisionSlot, QuoteWithStore } from './revision-snapshots';

/** A revision slot with its key (see `keyedRevisionSlots`). */
export type KeyedRevisionSlot = { key: string; slot: LoadedRevisionSlot };

/**
 * The key of each slot of one revision: the slot's own key (guide_slots.slot_key), which
 * stays the same from one revision to the next whatever its label (domain/sync.ts).
 * Fork, drift, sync and within-budget all key revision slots with this function.
 */
export function keyedRevisionSlots(slots: readonly LoadedRevisionSlot[]): KeyedRevisionSlot[] {
	return slots.map((slot) => ({ key: slot.slotKey, slot }));
}

/** A revision's slots as domain/sync.ts takes them. */
export function sourceSlotsOf(keyed: readonly KeyedRevisionSlot[]): SourceSlot[] {
	return keyed.map(({ key, slot }) => ({
		key,
		label: slot.label,
		category: slot.category,
		partId: slot.pickPartId,
		quantity: slot.quantity
	}));
}

/** The slots of a build's base revision, keyed, with a lookup by key. */
export interface BuildSource {
	/** Empty for a build without a base revision. */
	slots: KeyedRevisionSlot[];
	byKey: Map<string, LoadedRevisionSlot>;
}

/** Loads the base revision's slots (one query; none without a base revision). */
export async function loadBuildSource(baseRevisionId: number | null): Promise<BuildSource> {
	const slots = baseRevisionId ? keyedRevisionSlots(await loadRevisionSlots([baseRevisionId])) : [];
	return { slots, byKey: new Map(slots.map((k) => [k.key, k.slot])) };
}

function baseSlotOf(
	source: BuildSource,
	sourceSlotKey: string | null
): LoadedRevisionSlot | undefined {
	return sourceSlotKey === null ? undefined : source.byKey.get(sourceSlotKey);
}

/**
 * The author's chosen quote is the base price of the source pick (as on the guide page), so
 * a fresh fork costs what the guide shows in every region; other parts use the latest quote.
 */
export function chosenQuote(
	source: BuildSource,
	sourceSlotKey: string | null,
	partId: number
): QuoteWithStore | null {
	const baseSlot = baseSlotOf(source, sourceSlotKey);
	return baseSlot && baseSlot.pickPartId === partId ? baseSlot.priceQuote : null;
}

/** What the origin of a slot holding `partId` is, by the base revision's slot with its key. */
export function originOf(
	source: BuildSource,
	sourceSlotKey: string | null,
	partId: number
): BuildSlotOrigin {
	const baseSlot = baseSlotOf(source, sourceSlotKey);
	if (!baseSlot) return 'custom';
	if (baseSlot.pickPartId === partId) return 'source';
	return baseSlot.alternates.some((a) => a.partId === partId) ? 'alternate' : 'custom';
}

/** A part the source offers for a build slot: its pick or one of its alternates. */
export interface SourceOption {
	part: LoadedRevisionSlot['pick'];
	kind: 'source_pick' | 'alternate';
	/** 0 for the source pick; the alternate's rank otherwise. */
	rank: number;
	reasonTag: string | null;
	note: string;
	/** The author's quote for the source pick; null for alternates. */
	chosen: QuoteWithStore | null;
}

/** The base revision's pick (unless current) and its alternates (except the current part). */
export function optionsFor(
	source: BuildSource,
	slot: { sourceSlotKey: string | null; partId: number }
): SourceOption[] {
	const baseSlot = baseSlotOf(source, slot.sourceSlotKey);
	if (!baseSlot) return [];
	const out: SourceOption[] = [];
	if (baseSlot.pickPartId !== slot.partId) {
		out.push({
			part: baseSlot.pick,
			kind: 'source_pick',
			rank: 0,
			reasonTag: null,
			note: baseSlot.reason,
			chosen: baseSlot.priceQuote
		});
	}
	for (const alt of baseSlot.alternates) {
		if (alt.partId === slot.partId) continue;
		out.push({
			part: alt.part,
			kind: 'alternate',
			rank: alt.rank,
			reasonTag: alt.reasonTag,
			note: alt.note,
			chosen: null
		});
	}
	return out;
}
