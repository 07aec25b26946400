import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// A slot key names one slot within a revision; two slots of a revision never share one.
export const up: Migration = async ({ context: qi }) => {
	await qi.addIndex('guide_slots', ['revision_id', 'slot_key'], {
		unique: true,
		name: 'guide_slots_revision_slot_key'
	});
};

export const down: Migration = async ({ context: qi }) => {
	// The revision_id foreign key may be using this index: give it one of its own first.
	await qi.sequelize.query('CREATE INDEX guide_slots_revision_id ON guide_slots (revision_id)', {
		type: QueryTypes.RAW
	});
	await qi.sequelize.query('DROP INDEX guide_slots_revision_slot_key ON guide_slots', {
		type: QueryTypes.RAW
	});
};
