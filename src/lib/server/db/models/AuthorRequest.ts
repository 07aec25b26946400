import { DataTypes, Model } from 'sequelize';
import type {
	CreationOptional,
	ForeignKey,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import type { User } from './User.js';

export const AUTHOR_REQUEST_STATES = ['pending', 'approved', 'declined'] as const;
export type AuthorRequestState = (typeof AUTHOR_REQUEST_STATES)[number];

/**
 * A reader's request to become an author, with a short pitch, until an editor or admin
 * decides it. At most one pending request per user: the service enforces that under a
 * lock on the user's row (a plain unique index cannot express "unique while pending").
 */
export class AuthorRequest extends Model<
	InferAttributes<AuthorRequest>,
	InferCreationAttributes<AuthorRequest>
> {
	declare id: CreationOptional<number>;
	declare userId: ForeignKey<User['id']>;
	declare pitch: string;
	declare state: CreationOptional<AuthorRequestState>;
	declare decidedById: ForeignKey<User['id']> | null;
	declare decisionNote: CreationOptional<string | null>;
	declare decidedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initAuthorRequest(sequelize: Sequelize) {
	AuthorRequest.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			// Length 20–1000 characters is checked by the zod schema before it gets here.
			pitch: { type: DataTypes.TEXT, allowNull: false },
			state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
			decisionNote: { type: DataTypes.TEXT, allowNull: true },
			decidedAt: { type: DataTypes.DATE, allowNull: true },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'author_requests', underscored: true }
	);
}
