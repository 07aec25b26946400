import type { Migration } from '../umzug.js';

const NAME = 'guides_published_revision_fk';

export const up: Migration = async ({ context: qi }) => {
	await qi.addConstraint('guides', {
		name: NAME,
		type: 'foreign key',
		fields: ['published_revision_id'],
		references: { table: 'guide_revisions', field: 'id' },
		onDelete: 'SET NULL',
		onUpdate: 'CASCADE'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.removeConstraint('guides', NAME);
};
