import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { dropColumn } from './columns.js';

// The author marks a revision as major when submitting it; an approved major revision can
// be mailed to subscribers like a new guide (docs/architecture.md "Mailing").
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('guide_revisions', 'major', {
		type: DataTypes.BOOLEAN,
		allowNull: false,
		defaultValue: false
	});
};

export const down: Migration = async ({ context: qi }) => {
	await dropColumn(qi, 'guide_revisions', 'major');
};
