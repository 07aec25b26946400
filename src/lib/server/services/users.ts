/**
 * Accounts as the admin sees them: search, role changes, disabling. The only module that
 * changes a user's role or disabled state. Every change bumps the user's session version
 * (their signed-in sessions end on their next request) and writes an audit event in the
 * same transaction.
 */
import { Op } from 'sequelize';
import type { WhereOptions } from 'sequelize';
import type { Role } from '$lib/domain/types';
import { USERS_PER_PAGE } from '$lib/schemas/users';
import { User, sequelize } from '$lib/server/db';
import * as audit from './audit';
import type { Paged } from './audit';
import { escapeLike, pageWindow } from './list-query';
import type { AdminUserRow } from '$lib/views';
import type { Invalid, Outcome as BaseOutcome } from '$lib/schemas/issues';

/** What a change returns: routes map not_found to 404 and conflict to 409 with the message. */
export type Outcome<T extends object = object> = Exclude<BaseOutcome<T>, Invalid>;

// Listed explicitly so the password hash (and anything added to users later) never leaves.
const ROW_ATTRIBUTES = ['id', 'email', 'name', 'role', 'disabledAt', 'createdAt'] as const;

/**
 * Accounts whose name or e-mail contains `q` (case-insensitive, wildcards taken literally),
 * optionally of one role, newest first. `perPage` defaults to 25 and is capped at 100;
 * a page past the end gives the last page.
 */
export async function search(options: {
	q: string;
	role?: Role;
	page: number;
	perPage?: number;
}): Promise<Paged<AdminUserRow>> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage ?? USERS_PER_PAGE)), 100);
	const q = options.q.trim();
	const conditions: WhereOptions<User>[] = [];
	if (q !== '') {
		const pattern = `%${escapeLike(q)}%`;
		conditions.push({
			[Op.or]: [{ name: { [Op.like]: pattern } }, { email: { [Op.like]: pattern } }]
		});
	}
	if (options.role) conditions.push({ role: options.role });
	const where: WhereOptions<User> = conditions.length > 0 ? { [Op.and]: conditions } : {};

	const total = await User.count({ where });
	const window = pageWindow(total, options.page, perPage);
	const users = await User.findAll({
		where,
		attributes: [...ROW_ATTRIBUTES],
		// The e-mail tie-break keeps pages stable for accounts created in the same second.
		order: [
			['createdAt', 'DESC'],
			['email', 'ASC']
		],
		limit: perPage,
		offset: window.offset
	});
	return {
		items: users.map(toRow),
		total,
		page: window.page,
		perPage,
		pageCount: window.pageCount
	};
}

/**
 * Gives `userId` the role `role` on behalf of admin `actorId`. Refuses a change to the
 * role the user already has, and an admin removing their own admin role (that is how the
 * last admin would lock everyone out).
 */
export async function changeRole(
	actorId: string,
	userId: string,
	role: Role
): Promise<Outcome<{ user: AdminUserRow }>> {
	return sequelize.transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user) return { kind: 'not_found' } as const;
		if (user.role === role) {
			return {
				kind: 'conflict',
				message: `${displayName(user)} is already ${article(role)} ${role}.`
			} as const;
		}
		if (user.id === actorId && user.role === 'admin') {
			return {
				kind: 'conflict',
				message: 'You cannot remove your own admin role. Ask another admin to do it.'
			} as const;
		}
		// No session-version bump: the hook re-reads the role on every request, so the new
		// role applies on the user's next request without signing them out.
		const before = { role: user.role };
		user.role = role;
		await user.save({ transaction });
		await audit.record(
			{
				actorId,
				action: 'user.role_changed',
				subjectType: 'user',
				subjectId: user.id,
				before,
				after: { role: user.role }
			},
			transaction
		);
		return { kind: 'ok', user: toRow(user) } as const;
	});
}

/**
 * Disables (`disabled` true) or re-enables an account on behalf of admin `actorId`.
 * A disabled account cannot sign in and its sessions end on their next request.
 * Refuses acting on yourself and asking for the state the account is already in.
 */
export async function setDisabled(
	actorId: string,
	userId: string,
	disabled: boolean
): Promise<Outcome<{ user: AdminUserRow }>> {
	if (actorId === userId && disabled) {
		return { kind: 'conflict', message: 'You cannot disable your own account.' };
	}
	return sequelize.transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user) return { kind: 'not_found' } as const;
		if ((user.disabledAt !== null) === disabled) {
			return {
				kind: 'conflict',
				message: `${displayName(user)} is already ${disabled ? 'disabled' : 'enabled'}.`
			} as const;
		}
		const before = { disabledAt: iso(user.disabledAt), sessionVersion: user.sessionVersion };
		user.disabledAt = disabled ? wholeSecondNow() : null;
		user.sessionVersion = user.sessionVersion + 1;
		await user.save({ transaction });
		await audit.record(
			{
				actorId,
				action: disabled ? 'user.disabled' : 'user.enabled',
				subjectType: 'user',
				subjectId: user.id,
				before,
				after: { disabledAt: iso(user.disabledAt), sessionVersion: user.sessionVersion }
			},
			transaction
		);
		return { kind: 'ok', user: toRow(user) } as const;
	});
}

function toRow(user: User): AdminUserRow {
	return {
		id: user.id,
		email: user.email,
		name: user.name,
		role: user.role,
		state: user.disabledAt ? 'disabled' : 'active',
		disabledAt: iso(user.disabledAt),
		createdAt: user.createdAt.toISOString()
	};
}

/** DATETIME columns keep whole seconds: rounding first keeps the audit copy equal to the row. */
export function wholeSecondNow(): Date {
	return new Date(Math.floor(Date.now() / 1000) * 1000);
}

function iso(date: Date | null): string | null {
	return date ? date.toISOString() : null;
}

function displayName(user: User): string {
	return user.name?.trim() || user.email;
}

function article(role: Role): string {
	return role === 'admin' || role === 'author' || role === 'editor' ? 'an' : 'a';
}
