/*
 * The label rule slots were matched by before they had keys of their own, frozen here for
 * the migrations that turn it into stored keys: a slot's label, numbered from the second
 * time it repeats in a revision ("Storage", "Storage (2)"), cut to the 80 characters the
 * build_slots.source_slot_key column held. Kept in the migrations so later changes to the
 * domain cannot change what an old migration does.
 */
import { QueryTypes } from 'sequelize';
import type { QueryInterface } from 'sequelize';

export function labelKeys(labels: readonly string[]): string[] {
	const seen = new Map<string, number>();
	return labels.map((label) => {
		const n = (seen.get(label) ?? 0) + 1;
		seen.set(label, n);
		if (n === 1) return label;
		const suffix = ` (${n})`;
		return `${label.slice(0, 80 - suffix.length)}${suffix}`;
	});
}

export interface StoredSlot {
	id: number;
	guideId: number;
	revisionId: number;
	label: string;
	slotKey: string | null;
}

/** Every guide slot with its guide, in guide, revision number and position order. */
export async function storedSlots(qi: QueryInterface): Promise<StoredSlot[]> {
	return qi.sequelize.query<StoredSlot>(
		`SELECT s.id, r.guide_id AS guideId, s.revision_id AS revisionId, s.label,
		        s.slot_key AS slotKey
		   FROM guide_slots s JOIN guide_revisions r ON r.id = s.revision_id
		  ORDER BY r.guide_id, r.number, s.position, s.id`,
		{ type: QueryTypes.SELECT }
	);
}

/** Groups slots by revision, keeping the order they came in. */
export function byRevision(slots: readonly StoredSlot[]): StoredSlot[][] {
	const groups = new Map<number, StoredSlot[]>();
	for (const s of slots) {
		const group = groups.get(s.revisionId) ?? [];
		group.push(s);
		groups.set(s.revisionId, group);
	}
	return [...groups.values()];
}
