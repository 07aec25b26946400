import { DataTypes, Model, Op } from 'sequelize';
import type {
	CreationOptional,
	Transaction,
	InferAttributes,
	InferCreationAttributes,
	Sequelize
} from 'sequelize';
import { firstFreeHandle, handleBase } from '../../../domain/handles.js';
import type { Role } from '../../../domain/types.js';
import { GUIDE_EXTRAS } from '../generation-names.js';
import { bumpAfterWrites } from '../generation-hooks.js';

/**
 * An account. The id is a UUID so it matches what the Auth.js adapter expects and so
 * account ids cannot be enumerated. passwordHash is null for link-only accounts.
 */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<string>;
	declare email: string;
	declare name: string | null;
	/** The author page's address, /authors/[handle]; made from the name when not given. */
	declare handle: CreationOptional<string>;
	/** A short plain-text bio for the author page. */
	declare bio: CreationOptional<string | null>;
	declare passwordHash: CreationOptional<string | null>;
	declare role: CreationOptional<Role>;
	/** Named for the Auth.js adapter; stored as email_verified_at. */
	declare emailVerified: CreationOptional<Date | null>;
	declare image: CreationOptional<string | null>;
	/** Sessions carrying an older number are refused (see the auth hook). */
	declare sessionVersion: CreationOptional<number>;
	declare disabledAt: CreationOptional<Date | null>;
	/** The weekly upkeep digest e-mail (new alerts on the author's guides); off by default. */
	declare upkeepDigest: CreationOptional<boolean>;
	/** When the digest was last turned on: the first digest lists alerts seen since then. */
	declare upkeepDigestSince: CreationOptional<Date | null>;
	/** Basis points of the published total a guide's total may move before an alert (1000 = 10 %). */
	declare upkeepMoveThresholdBp: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initUser(sequelize: Sequelize) {
	User.init(
		{
			id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
			email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
			name: { type: DataTypes.STRING(120), allowNull: true },
			handle: { type: DataTypes.STRING(30), allowNull: false, unique: true },
			bio: { type: DataTypes.STRING(600), allowNull: true },
			passwordHash: { type: DataTypes.STRING(255), allowNull: true },
			role: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'reader' },
			emailVerified: { type: DataTypes.DATE, allowNull: true, field: 'email_verified_at' },
			image: { type: DataTypes.STRING(500), allowNull: true },
			sessionVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			disabledAt: { type: DataTypes.DATE, allowNull: true },
			upkeepDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			upkeepDigestSince: { type: DataTypes.DATE, allowNull: true },
			upkeepMoveThresholdBp: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1000 },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'users', underscored: true }
	);
	// Every way an account is created (sign-up, the Auth.js adapter for sign-in links, seeds,
	// tests) goes through create(), so the handle is filled here rather than in each caller.
	// Two sign-ups with the same name at the same moment can still collide on the unique
	// index; the second then fails like any other write and can be retried.
	User.addHook('beforeValidate', async (user: User, options: object) => {
		if (!user.isNewRecord || user.handle) return;
		const base = handleBase(user.name);
		const rows = await User.findAll({
			attributes: ['handle'],
			where: { handle: { [Op.or]: [base, { [Op.like]: `${base}-%` }] } },
			// Sequelize hands create()'s own options to this hook: same transaction, same snapshot.
			transaction: (options as { transaction?: Transaction | null }).transaction ?? null
		});
		user.handle = firstFreeHandle(base, new Set(rows.map((r) => r.handle)));
	});
	// Builders' and supporters' names on the guide page, and whether its author can take tips
	// (services/guide-page-extras.ts).
	bumpAfterWrites(User, sequelize, GUIDE_EXTRAS, { listed: new Set(['name', 'disabledAt']) });
}
