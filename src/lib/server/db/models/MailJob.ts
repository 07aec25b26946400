import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { Mailing } from './Mailing.js';
import type { Subscriber } from './Subscriber.js';

/**
 * queued → sending (claimed, lease and attempt id committed before any SMTP) → sent | failed
 * | queued again (temporary failure, with back-off). `skipped`: nothing sent because the
 * recipient left before their turn. `in_doubt`: a worker stopped while sending and the
 * delivery could not be checked; never resent automatically (src/lib/server/mail/queue).
 */
export const MAIL_JOB_STATUSES = [
	'queued',
	'sending',
	'sent',
	'failed',
	'skipped',
	'in_doubt'
] as const;
export type MailJobStatus = (typeof MAIL_JOB_STATUSES)[number];
/** mailing: one recipient of a Mailing; message: a whole message kept in the payload. */
export const MAIL_JOB_KINDS = ['mailing', 'message'] as const;
export type MailJobKind = (typeof MAIL_JOB_KINDS)[number];

export class MailJob extends Model<InferAttributes<MailJob>, InferCreationAttributes<MailJob>> {
	declare id: CreationOptional<number>;
	declare kind: MailJobKind;
	declare mailingId: ForeignKey<Mailing['id']> | null;
	declare subscriberId: ForeignKey<Subscriber['id']> | null;
	declare toEmail: string;
	declare payload: Record<string, unknown>;
	declare messageId: string;
	declare status: CreationOptional<MailJobStatus>;
	declare attempts: CreationOptional<number>;
	declare nextAttemptAt: CreationOptional<Date>;
	declare leaseUntil: CreationOptional<Date | null>;
	declare attemptId: CreationOptional<string | null>;
	declare smtpCode: CreationOptional<number | null>;
	declare lastError: CreationOptional<string | null>;
	declare sentAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initMailJob(sequelize: Sequelize) {
	MailJob.init(
		{
			id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
			kind: { type: DataTypes.STRING(16), allowNull: false },
			toEmail: { type: DataTypes.STRING(254), allowNull: false },
			payload: { type: DataTypes.JSON, allowNull: false },
			messageId: { type: DataTypes.STRING(200), allowNull: false, unique: true },
			status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'queued' },
			attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
			nextAttemptAt: {
				type: DataTypes.DATE(3),
				allowNull: false,
				defaultValue: DataTypes.NOW
			},
			leaseUntil: { type: DataTypes.DATE(3), allowNull: true },
			attemptId: { type: DataTypes.CHAR(36), allowNull: true },
			smtpCode: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
			lastError: { type: DataTypes.STRING(300), allowNull: true },
			sentAt: { type: DataTypes.DATE(3), allowNull: true },
			createdAt: DataTypes.DATE(3),
			updatedAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'mail_jobs', underscored: true }
	);
}
