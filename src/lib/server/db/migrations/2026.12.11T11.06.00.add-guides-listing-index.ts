import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// The guide list's filter and order on the guide row itself: listed (state, not hidden),
// featured or not, newest first. Home's featured list and the editors' lists start here.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'CREATE INDEX guides_listing ON guides (state, hidden_at, featured, updated_at)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX guides_listing ON guides', { type: QueryTypes.RAW });
};
