/**
 * Model rows to the plain shapes views and computations carry, written once: a part reads
 * the same on the guide page, the build page, the sync table and in every API answer, and
 * the fit report gets its slots from one place. Pricing's own mappers (quote and region to
 * the domain's inputs, priced line to the view's) live in pricing.ts.
 */
import type { BuildPart, PartInfo } from '$lib/domain/build-parts';
import type { GuideSlot as DropInSlot } from '$lib/domain/dropins';
import type { PartCategory } from '$lib/domain/types';
import type { Part, Region } from '$lib/server/db';
import type { PartRef, RegionSummary } from '$lib/views';

/** What pages and the API show of a part: enough to name it and link to it. */
export function partRef(p: Part): PartRef {
	return { id: p.id, slug: p.slug, brand: p.brand, model: p.model, category: p.category };
}

/** What the fit report, power budget and drop-ins read of a part. */
export function partInfo(p: Pick<Part, 'brand' | 'model' | 'specs'>): PartInfo {
	// Specs were checked against the category's schema when the part was written.
	return { brand: p.brand, model: p.model, specs: p.specs } as unknown as PartInfo;
}

/** "Brand Model". */
export function partName(p: Pick<Part, 'brand' | 'model'>): string {
	return `${p.brand} ${p.model}`;
}

/** What pages and the API show of a region. */
export function regionSummary(r: Region): RegionSummary {
	return {
		code: r.code,
		name: r.name,
		currency: r.currency,
		taxMode: r.taxMode,
		taxRateBp: r.taxRateBp
	};
}

/** A slot with its part and the parts that could replace it, as the drop-in pass takes it. */
export function dropInSlot(
	key: string,
	slot: { label: string; category: PartCategory; quantity: number },
	part: Pick<Part, 'brand' | 'model' | 'specs'>,
	alternates: readonly { id: string | number; part: Pick<Part, 'brand' | 'model' | 'specs'> }[]
): DropInSlot {
	// The category narrows the specs' type; the part was checked against it when written.
	return {
		key,
		label: slot.label,
		category: slot.category,
		quantity: slot.quantity,
		pick: partInfo(part),
		alternates: alternates.map((a) => ({ id: a.id, part: partInfo(a.part) }))
	} as unknown as DropInSlot;
}

/** The parts in place (each slot's pick), as the fit report and power budget take them. */
export function picksOf(slots: readonly DropInSlot[]): BuildPart[] {
	return slots.map(
		(d) =>
			({
				key: d.key,
				label: d.label,
				category: d.category,
				quantity: d.quantity,
				part: d.pick
			}) as unknown as BuildPart
	);
}
