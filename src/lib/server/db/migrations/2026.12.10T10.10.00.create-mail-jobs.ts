import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { references } from './columns.js';

/*
 * The mail queue (src/lib/server/mail/queue): one row per message to send. Workers claim
 * rows with SELECT … FOR UPDATE SKIP LOCKED, mark them `sending` with a lease and an
 * attempt id before talking SMTP, and record the server's answer on the same row.
 * UNIQUE (mailing_id, subscriber_id): a mailing has one job per recipient, so starting it
 * twice cannot queue anyone twice. UNIQUE message_id: the Message-ID is fixed when the job
 * is queued (from mailing and subscriber for mailings), so every attempt of a job carries
 * the same one and a delivery can be looked up by it after a crash. DATETIME(3) so leases
 * and back-off are compared in milliseconds on the database's clock.
 */
const ms = { type: DataTypes.DATE(3), allowNull: true };

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('mail_jobs', {
		id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
		kind: { type: DataTypes.STRING(16), allowNull: false },
		mailing_id: references('mailings', 'CASCADE', true),
		subscriber_id: references('subscribers', 'CASCADE', true),
		to_email: { type: DataTypes.STRING(254), allowNull: false },
		// kind 'mailing': the recipient's own values; otherwise the whole message.
		payload: { type: DataTypes.JSON, allowNull: false },
		message_id: { type: DataTypes.STRING(200), allowNull: false, unique: true },
		status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'queued' },
		attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
		next_attempt_at: { ...ms, allowNull: false },
		lease_until: ms,
		attempt_id: { type: DataTypes.CHAR(36), allowNull: true },
		smtp_code: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
		last_error: { type: DataTypes.STRING(300), allowNull: true },
		sent_at: ms,
		created_at: { ...ms, allowNull: false },
		updated_at: { ...ms, allowNull: false }
	});
	await qi.addIndex('mail_jobs', ['mailing_id', 'subscriber_id'], { unique: true });
	await qi.addIndex('mail_jobs', ['status', 'next_attempt_at']);
	await qi.addIndex('mail_jobs', ['status', 'lease_until']);
	await qi.addIndex('mail_jobs', ['mailing_id', 'status']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('mail_jobs');
};
