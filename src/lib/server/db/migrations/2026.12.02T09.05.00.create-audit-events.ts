import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser } from './columns.js';

// Append-only trail of privileged changes, so there is no updated_at.
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('audit_events', {
		id: idColumn,
		// SET NULL: deleting an account must not erase what it did.
		actor_id: referencesUser('SET NULL'),
		action: { type: DataTypes.STRING(64), allowNull: false },
		subject_type: { type: DataTypes.STRING(32), allowNull: false },
		subject_id: { type: DataTypes.STRING(64), allowNull: false },
		before: { type: DataTypes.JSON, allowNull: true },
		after: { type: DataTypes.JSON, allowNull: true },
		created_at: { type: DataTypes.DATE, allowNull: false }
	});
	// "What happened to this record" and "what happened lately" are the two ways it is read.
	await qi.addIndex('audit_events', ['subject_type', 'subject_id'], {
		name: 'audit_events_subject'
	});
	await qi.addIndex('audit_events', ['created_at'], { name: 'audit_events_created_at' });
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('audit_events');
};
