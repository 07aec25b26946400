import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// Guide search for words shorter than the full-text index's minimum token: a title prefix.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('CREATE INDEX guides_title ON guides (title)', { type: QueryTypes.RAW });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query('DROP INDEX guides_title ON guides', { type: QueryTypes.RAW });
};
