import { QueryTypes } from 'sequelize';
import type { QueryInterface } from 'sequelize';
import type { Migration } from '../umzug.js';
import { byRevision, labelKeys, storedSlots } from './slot-label-keys.js';

/*
 * build_slots.source_slot_key held the source slot's label key ("Storage (2)"); from now on
 * it holds that slot's own key (guide_slots.slot_key). Each build slot gets the key of the
 * slot its label key named in the build's base revision, as the label rule matched it until
 * now. A key the base revision does not have was already read as the reader's own slot; it
 * becomes NULL, which reads the same. Data only: the column stays as it is.
 */

interface LinkedSlot {
	id: number;
	baseRevisionId: number | null;
	sourceSlotKey: string;
}

async function linkedSlots(qi: QueryInterface): Promise<LinkedSlot[]> {
	return qi.sequelize.query<LinkedSlot>(
		`SELECT bs.id, b.base_revision_id AS baseRevisionId, bs.source_slot_key AS sourceSlotKey
		   FROM build_slots bs JOIN builds b ON b.id = bs.build_id
		  WHERE bs.source_slot_key IS NOT NULL`,
		{ type: QueryTypes.SELECT }
	);
}

/** Per revision: label key → slot key, and slot key → label key. */
async function revisionKeys(qi: QueryInterface) {
	const byLabel = new Map<number, Map<string, string>>();
	const byKey = new Map<number, Map<string, string>>();
	for (const revision of byRevision(await storedSlots(qi))) {
		const labels = labelKeys(revision.map((s) => s.label));
		const toKey = new Map<string, string>();
		const toLabel = new Map<string, string>();
		for (const [i, slot] of revision.entries()) {
			const label = labels[i] ?? slot.label;
			if (slot.slotKey === null) continue;
			toKey.set(label, slot.slotKey);
			toLabel.set(slot.slotKey, label);
		}
		const id = revision[0]?.revisionId;
		if (id === undefined) continue;
		byLabel.set(id, toKey);
		byKey.set(id, toLabel);
	}
	return { byLabel, byKey };
}

async function relink(qi: QueryInterface, direction: 'up' | 'down'): Promise<void> {
	const maps = await revisionKeys(qi);
	const table = direction === 'up' ? maps.byLabel : maps.byKey;
	for (const slot of await linkedSlots(qi)) {
		const next =
			slot.baseRevisionId === null
				? null
				: (table.get(slot.baseRevisionId)?.get(slot.sourceSlotKey) ?? null);
		await qi.sequelize.query('UPDATE build_slots SET source_slot_key = ? WHERE id = ?', {
			replacements: [next, slot.id],
			type: QueryTypes.UPDATE
		});
	}
}

export const up: Migration = async ({ context: qi }) => relink(qi, 'up');

// Back to label keys, read off the same base revision.
export const down: Migration = async ({ context: qi }) => relink(qi, 'down');
