import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// Guide text search (title, summary, build notes) over the published revision's text, which
// is what the guide page shows (services/guide-browse.ts).
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'CREATE FULLTEXT INDEX guide_revisions_text_fulltext ON guide_revisions (title, summary, build_notes_md)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX guide_revisions_text_fulltext ON guide_revisions', {
		type: QueryTypes.RAW
	});
};
