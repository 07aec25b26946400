import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

// One ALTER (so it cannot stop half-way): every account has a handle, and no two share one.
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'ALTER TABLE users MODIFY handle VARCHAR(30) NOT NULL, ADD UNIQUE INDEX users_handle_unique (handle)',
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		'ALTER TABLE users DROP INDEX users_handle_unique, MODIFY handle VARCHAR(30) NULL',
		{ type: QueryTypes.RAW }
	);
};
