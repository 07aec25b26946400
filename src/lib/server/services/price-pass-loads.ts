/**
 * What the full pass of stored guide prices (guide-prices.ts refreshAll) reads for one page
 * of published revisions, as typed raw rows: their slots with the picks and the authors'
 * chosen quotes, the ranked alternates, and the latest active quote of every part involved
 * in every region. A few queries per page, whatever the number of regions; no model
 * instances (building them for a million quotes was most of the pass's time).
 *
 * The rows carry exactly what pricing (pricing.ts revisionSlotToPrice) and the upkeep alerts
 * (upkeep-alerts.ts) read of a LoadedRevisionSlot, in the same order (slots by position,
 * alternates by rank), so the pass stores the figures the guide page shows.
 */
import { QueryTypes } from 'sequelize';
import type { PartCategory } from '$lib/domain/types';
import { sequelize } from '$lib/server/db';
import { quoteInput } from './pricing';
import type { ChosenQuote, LatestQuotes, SlotForPricing } from './pricing';

/** What the fit report, drop-ins and alert texts read of a part. */
export interface PassPart {
	id: number;
	brand: string;
	model: string;
	specs: Record<string, unknown>;
}

export interface PassSlot extends SlotForPricing {
	revisionId: number;
	slotKey: string;
	label: string;
	pick: PassPart;
	alternates: { partId: number; part: PassPart }[];
}

interface SlotRow {
	id: number;
	revisionId: number;
	slotKey: string;
	label: string;
	category: PartCategory;
	quantity: number;
	pickPartId: number;
	brand: string;
	model: string;
	specs: unknown;
	quoteRegionId: number | null;
	amountMinor: number | string | null;
	currency: string | null;
	taxIncluded: number | boolean | null;
	observedAt: Date | string | null;
	storeName: string | null;
}

interface AlternateRow {
	slotId: number;
	partId: number;
	brand: string;
	model: string;
	specs: unknown;
}

interface QuoteRow {
	partId: number;
	regionId: number;
	amountMinor: number | string;
	currency: string;
	taxIncluded: number | boolean;
	observedAt: Date | string;
	storeName: string;
}

/** JSON columns arrive as text from a raw query (MariaDB's JSON is LONGTEXT). */
function json(v: unknown): Record<string, unknown> {
	return (typeof v === 'string' ? JSON.parse(v) : v) as Record<string, unknown>;
}

/** The slots of these revisions, in position order, each with its ranked alternates. */
export async function loadPassSlots(revisionIds: readonly number[]): Promise<PassSlot[]> {
	if (revisionIds.length === 0) return [];
	const [slotRows, alternateRows] = await Promise.all([
		sequelize.query<SlotRow>(
			`SELECT s.id, s.revision_id AS revisionId, s.slot_key AS slotKey, s.label, s.category,
			        s.quantity, s.pick_part_id AS pickPartId, p.brand, p.model, p.specs,
			        q.region_id AS quoteRegionId, q.amount_minor AS amountMinor, q.currency,
			        q.tax_included AS taxIncluded, q.observed_at AS observedAt, st.name AS storeName
			   FROM guide_slots s
			   JOIN parts p ON p.id = s.pick_part_id
			   LEFT JOIN quotes q ON q.id = s.price_quote_id
			   LEFT JOIN stores st ON st.id = q.store_id
			  WHERE s.revision_id IN (:ids)
			  ORDER BY s.revision_id, s.position, s.id`,
			{ type: QueryTypes.SELECT, replacements: { ids: [...revisionIds] } }
		),
		sequelize.query<AlternateRow>(
			`SELECT a.slot_id AS slotId, a.part_id AS partId, p.brand, p.model, p.specs
			   FROM slot_alternates a
			   JOIN guide_slots s ON s.id = a.slot_id
			   JOIN parts p ON p.id = a.part_id
			  WHERE s.revision_id IN (:ids)
			  ORDER BY a.slot_id, a.rank, a.id`,
			{ type: QueryTypes.SELECT, replacements: { ids: [...revisionIds] } }
		)
	]);
	const alternatesOf = new Map<number, PassSlot['alternates']>();
	for (const a of alternateRows) {
		const list = alternatesOf.get(Number(a.slotId)) ?? [];
		const partId = Number(a.partId);
		list.push({
			partId,
			part: { id: partId, brand: a.brand, model: a.model, specs: json(a.specs) }
		});
		alternatesOf.set(Number(a.slotId), list);
	}
	return slotRows.map((s) => {
		const pickPartId = Number(s.pickPartId);
		// A chosen quote always has a store (foreign key), so storeName stands for the join.
		const priceQuote: ChosenQuote | null =
			s.quoteRegionId === null || s.storeName === null
				? null
				: {
						regionId: Number(s.quoteRegionId),
						amountMinor: Number(s.amountMinor),
						currency: String(s.currency),
						taxIncluded: Boolean(s.taxIncluded),
						observedAt: new Date(s.observedAt as Date),
						store: { name: s.storeName }
					};
		return {
			revisionId: Number(s.revisionId),
			slotKey: s.slotKey,
			label: s.label,
			category: s.category,
			quantity: Number(s.quantity),
			pickPartId,
			pick: { id: pickPartId, brand: s.brand, model: s.model, specs: json(s.specs) },
			priceQuote,
			alternates: alternatesOf.get(Number(s.id)) ?? []
		};
	});
}

/**
 * The latest active quote of each of these parts in every region (any store): the newest
 * observation, the newest row among equal dates, as pricing.ts defines "latest".
 */
export async function loadLatestQuotes(partIds: readonly number[]): Promise<LatestQuotes> {
	const result: LatestQuotes = new Map();
	if (partIds.length === 0) return result;
	const rows = await sequelize.query<QuoteRow>(
		`SELECT q.part_id AS partId, q.region_id AS regionId, q.amount_minor AS amountMinor,
		        q.currency, q.tax_included AS taxIncluded, q.observed_at AS observedAt,
		        st.name AS storeName
		   FROM quotes q JOIN stores st ON st.id = q.store_id
		  WHERE q.part_id IN (:parts) AND q.status = 'active'
		  ORDER BY q.observed_at DESC, q.id DESC`,
		{ type: QueryTypes.SELECT, replacements: { parts: [...partIds] } }
	);
	for (const q of rows) {
		const regionId = Number(q.regionId);
		const partId = Number(q.partId);
		const inRegion = result.get(regionId) ?? new Map();
		if (!inRegion.has(partId))
			inRegion.set(
				partId,
				quoteInput({
					regionId,
					amountMinor: Number(q.amountMinor),
					currency: q.currency,
					taxIncluded: Boolean(q.taxIncluded),
					observedAt: new Date(q.observedAt),
					store: { name: q.storeName }
				})
			);
		result.set(regionId, inRegion);
	}
	return result;
}
