import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { User } from './User.js';

/**
 * The relevant fields of the subject before or after the change, as JSON. A flat record
 * rather than a recursive JSON type: Sequelize's where-types recurse into attribute types.
 */
export type AuditSnapshot = Record<string, unknown>;

/**
 * One privileged change: who did what to which record, and the record's relevant fields
 * before and after. Append-only: there is no updatedAt, and no code path edits a row.
 * actorId survives as NULL when the acting account is deleted, so the trail is kept.
 */
export class AuditEvent extends Model<
	InferAttributes<AuditEvent>,
	InferCreationAttributes<AuditEvent>
> {
	declare id: CreationOptional<number>;
	declare actorId: ForeignKey<User['id']> | null;
	/** Dotted `subject.verb`, e.g. 'user.role_changed' (see AUDIT_ACTIONS in services/audit). */
	declare action: string;
	declare subjectType: string;
	/** A string so one column can point at UUID and integer keys alike. */
	declare subjectId: string;
	declare before: AuditSnapshot | null;
	declare after: AuditSnapshot | null;
	declare createdAt: CreationOptional<Date>;
}

export function initAuditEvent(sequelize: Sequelize) {
	AuditEvent.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			action: { type: DataTypes.STRING(64), allowNull: false },
			subjectType: { type: DataTypes.STRING(32), allowNull: false },
			subjectId: { type: DataTypes.STRING(64), allowNull: false },
			before: { type: DataTypes.JSON, allowNull: true },
			after: { type: DataTypes.JSON, allowNull: true },
			createdAt: DataTypes.DATE
		},
		{
			sequelize,
			tableName: 'audit_events',
			underscored: true,
			updatedAt: false,
			indexes: [{ fields: ['subject_type', 'subject_id'] }, { fields: ['created_at'] }]
		}
	);
}
