/**
 * Revisions as the diff and the fit report take them: slots with picks (and specs),
 * the author's quotes with their stores, and ranked alternates, loaded in one query for
 * any number of revisions. Shared by the public revision history and the review pages.
 */
import type { BuildPart } from '$lib/domain/build-parts';
import { formatMoney, money } from '$lib/domain/money';
import type { RevisionSnapshot } from '$lib/domain/revision-diff';
import {
	GuidePriceProposal,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	SlotAlternate,
	Store
} from '$lib/server/db';

export type QuoteWithStore = Quote & { store: Store };
type PriceWithStore = Pick<Quote, 'amountMinor' | 'currency' | 'observedAt'> & {
	url: string | null;
	store: Store;
};
export type LoadedRevisionSlot = GuideSlot & {
	pick: Part;
	priceQuote: QuoteWithStore | null;
	/** The price typed into this slot while its revision is not approved (a proposal). */
	proposedPrice?: PriceWithStore | null;
	alternates: (SlotAlternate & { part: Part })[];
};

/** The price the author gave a slot: its open proposal, else the quote it points at. */
export function slotPrice(slot: LoadedRevisionSlot): PriceWithStore | null {
	return slot.proposedPrice ?? slot.priceQuote;
}

/** Slots of the given revisions in position order, alternates by rank. */
export async function loadRevisionSlots(revisionIds: number[]): Promise<LoadedRevisionSlot[]> {
	if (revisionIds.length === 0) return [];
	const slots = (await GuideSlot.findAll({
		where: { revisionId: revisionIds },
		include: [
			{ model: Part, as: 'pick' },
			{ model: Quote, as: 'priceQuote', include: [{ model: Store, as: 'store' }] },
			{ model: SlotAlternate, as: 'alternates', include: [{ model: Part, as: 'part' }] }
		],
		order: [
			['position', 'ASC'],
			[{ model: SlotAlternate, as: 'alternates' }, 'rank', 'ASC']
		]
	})) as LoadedRevisionSlot[];
	const proposals = (await GuidePriceProposal.findAll({
		where: { revisionId: revisionIds, quoteId: null },
		include: [{ model: Store, as: 'store' }]
	})) as (GuidePriceProposal & { store: Store })[];
	const byKey = new Map(proposals.map((p) => [`${p.revisionId}:${p.position}`, p]));
	for (const slot of slots) {
		const p = byKey.get(`${slot.revisionId}:${slot.position}`);
		slot.proposedPrice = p
			? {
					amountMinor: p.amountMinor,
					currency: p.currency,
					observedAt: p.observedAt,
					url: null,
					store: p.store
				}
			: null;
	}
	return slots;
}

/** "USD 329.99 at Northgate Parts, 2026-11-20", or null without a quote. */
export function quoteText(quote: PriceWithStore | null): string | null {
	if (!quote) return null;
	const amount = formatMoney(money(Number(quote.amountMinor), quote.currency));
	return `${amount} at ${quote.store.name}, ${quote.observedAt.toISOString().slice(0, 10)}`;
}

/**
 * A revision's content for revisionDiff. `withPrices` adds the author's quoted price per
 * slot, so a changed price shows in the diff (the review page wants it; the public
 * history compares what the author chose, not shelf prices).
 */
export function snapshotOf(
	revision: GuideRevision,
	slots: LoadedRevisionSlot[],
	withPrices = false
): RevisionSnapshot {
	return {
		number: revision.number,
		buildNotesMd: revision.buildNotesMd,
		slots: slots
			.filter((s) => s.revisionId === revision.id)
			.map((s) => ({
				key: s.slotKey,
				label: s.label,
				category: s.category,
				pick: { id: s.pick.id, name: `${s.pick.brand} ${s.pick.model}` },
				quantity: s.quantity,
				reason: s.reason,
				...(withPrices ? { price: quoteText(slotPrice(s)) } : {}),
				alternates: s.alternates.map((alt) => ({
					partId: alt.part.id,
					name: `${alt.part.brand} ${alt.part.model}`,
					rank: alt.rank,
					reasonTag: alt.reasonTag,
					note: alt.note
				}))
			}))
	};
}

/** A revision with nothing in it: what a brand-new guide is compared against. */
export function emptySnapshot(): RevisionSnapshot {
	return { number: 0, buildNotesMd: '', slots: [] };
}

/** The picks as the fit report and power budget take them (key: the slot's label). */
export function buildPartsOf(slots: LoadedRevisionSlot[]): BuildPart[] {
	return slots.map(
		(s) =>
			({
				key: s.label,
				label: s.label,
				category: s.category,
				quantity: s.quantity,
				part: { brand: s.pick.brand, model: s.pick.model, specs: s.pick.specs }
			}) as unknown as BuildPart
	);
}
