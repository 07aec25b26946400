import { randomUUID } from 'node:crypto';
import { DataTypes, QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';
import { byRevision, labelKeys, storedSlots } from './slot-label-keys.js';

/*
 * A guide slot's own identity, made when the author first adds the slot and carried from
 * revision to revision, so sync and revision diff no longer match slots by label (a rename
 * read as removed + added; repeated labels collided). Existing slots of one guide that the
 * label rule matched across revisions get one key, so existing links keep working.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guide_slots', 'slot_key', { type: DataTypes.CHAR(36), allowNull: true });
	const slots = await storedSlots(qi);
	const keysByGuide = new Map<number, Map<string, string>>();
	for (const revision of byRevision(slots)) {
		const first = revision[0];
		if (!first) continue;
		const keys = keysByGuide.get(first.guideId) ?? new Map<string, string>();
		keysByGuide.set(first.guideId, keys);
		const labels = labelKeys(revision.map((s) => s.label));
		for (const [i, slot] of revision.entries()) {
			const label = labels[i] ?? slot.label;
			const key = keys.get(label) ?? randomUUID();
			keys.set(label, key);
			await qi.sequelize.query('UPDATE guide_slots SET slot_key = ? WHERE id = ?', {
				replacements: [key, slot.id],
				type: QueryTypes.UPDATE
			});
		}
	}
	// Raw and typed: the mariadb driver rejects Sequelize's untyped ALTER (see columns.ts).
	await qi.sequelize.query('ALTER TABLE guide_slots MODIFY slot_key CHAR(36) NOT NULL', {
		type: QueryTypes.RAW
	});
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guide_slots', 'slot_key');
};
