import type { Migration } from '../umzug.js';
import { idColumn, references, referencesUser, timestamps } from './columns.js';

/*
 * Who reported a price sighting: one row per person, so a merged sighting counts people,
 * not clicks, and every reporter sees it in their own list.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('price_sighting_reports', {
		id: idColumn,
		sighting_id: references('price_sightings', 'CASCADE'),
		// CASCADE: a deleted account's reports go; the sighting and its count stay.
		user_id: referencesUser('CASCADE', false),
		...timestamps
	});
	await qi.addIndex('price_sighting_reports', ['sighting_id', 'user_id'], {
		name: 'price_sighting_reports_one_per_person',
		unique: true
	});
	await qi.addIndex('price_sighting_reports', ['user_id'], { name: 'price_sighting_reports_user' });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('price_sighting_reports');
};
