/**
 * Accounts: sign-up with e-mail verification, password check, reset and change, profile,
 * deletion. Answers never reveal whether an e-mail address has an account.
 */
import { createHash, randomBytes } from 'node:crypto';
import { Op, UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import { EmailToken, Guide, User, sequelize } from '$lib/server/db';
import type { EmailTokenPurpose } from '$lib/server/db/models/EmailToken';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';
import { runLater } from '$lib/server/background';
import { bumpGuideLists } from '$lib/server/services/cache-generations';
import * as mail from '$lib/server/mail';
import * as templates from '$lib/server/mail/templates';
import type { Role } from '$lib/domain/types';

export const VERIFY_EMAIL_MINUTES = 24 * 60;
export const CHANGE_EMAIL_MINUTES = 60;
/** Out-of-band links used to get into an account expire within 10 minutes (ASVS 6.5.5). */
export const RESET_PASSWORD_MINUTES = 10;

const MINUTE_MS = 60_000;

// Checked when the e-mail is unknown, so a wrong address costs as long as a wrong password.
let timingDecoyHash: Promise<string> | undefined;

export interface AccountView {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	emailVerified: boolean;
	hasPassword: boolean;
	createdAt: string;
}

function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

async function issueToken(
	userId: string,
	purpose: EmailTokenPurpose,
	minutes: number,
	transaction?: Transaction,
	newEmail: string | null = null
) {
	const token = randomBytes(32).toString('base64url');
	await EmailToken.create(
		{
			userId,
			purpose,
			tokenHash: hashToken(token),
			expiresAt: new Date(Date.now() + minutes * MINUTE_MS),
			newEmail
		},
		{ transaction }
	);
	return token;
}

/** Marks a token used and returns it, or null when unknown, used or expired. */
async function redeem(
	token: string,
	purpose: EmailTokenPurpose,
	transaction: Transaction
): Promise<EmailToken | null> {
	const row = await EmailToken.findOne({
		where: { tokenHash: hashToken(token), purpose },
		lock: transaction.LOCK.UPDATE,
		transaction
	});
	if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) return null;
	await row.update({ usedAt: new Date() }, { transaction });
	return row;
}

/** The user id of a redeemed token, or null. */
async function redeemToken(
	token: string,
	purpose: EmailTokenPurpose,
	transaction: Transaction
): Promise<string | null> {
	return (await redeem(token, purpose, transaction))?.userId ?? null;
}

export type SignUpOutcome = { kind: 'ok' };

/**
 * Signs up: an unverified reader account and a verification link, or, when the address is
 * taken, a note to its owner; the caller sees the same outcome either way.
 *
 * Answering must not tell the two apart, by content or by time (issue 12, item 8). So the
 * expensive part, the argon2 hash, is done for every sign-up before answering, and
 * everything that depends on the address (the look-up, the new row or the note, the e-mail)
 * runs after the answer.
 */
export async function signUp(
	input: { name: string; email: string; password: string },
	origin: string
): Promise<SignUpOutcome> {
	const passwordHash = await hashPassword(input.password);
	runLater('sign-up', () => completeSignUp(input.name, input.email, passwordHash, origin));
	return { kind: 'ok' };
}

async function completeSignUp(name: string, email: string, passwordHash: string, origin: string) {
	const existing = await User.findOne({ where: { email } });
	if (existing) {
		mail.sendLater(
			existing.email,
			templates.signUpWithExistingEmail({
				signInUrl: `${origin}/signin`,
				resetUrl: `${origin}/reset`
			})
		);
		return;
	}
	let token: string;
	try {
		token = await sequelize.transaction(async (transaction) => {
			const user = await User.create(
				{ email, name, passwordHash, role: 'reader', emailVerified: null },
				{ transaction }
			);
			return issueToken(user.id, 'verify_email', VERIFY_EMAIL_MINUTES, transaction);
		});
	} catch (e) {
		// Two sign-ups for one new address at once: the first one made the account.
		if (e instanceof UniqueConstraintError) return;
		throw e;
	}
	mail.sendLater(email, templates.verifyEmail({ name, url: `${origin}/verify?token=${token}` }));
}

/** Confirms an address from its link. */
export async function verifyEmail(token: string): Promise<'verified' | 'invalid'> {
	return sequelize.transaction(async (transaction) => {
		const userId = await redeemToken(token, 'verify_email', transaction);
		if (!userId) return 'invalid';
		await User.update(
			{ emailVerified: new Date() },
			{ where: { id: userId, emailVerified: null }, transaction }
		);
		return 'verified';
	});
}

export interface AuthenticatedUser {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	sessionVersion: number;
}

/**
 * Checks an e-mail and password. Unknown address, wrong password, unverified address and
 * disabled account all give null, after the same argon2 work.
 */
export async function authenticate(
	email: string,
	password: string
): Promise<AuthenticatedUser | null> {
	const user = await User.findOne({ where: { email } });
	if (!user?.passwordHash) {
		timingDecoyHash ??= hashPassword(randomBytes(16).toString('hex'));
		await verifyPassword(await timingDecoyHash, password);
		return null;
	}
	const ok = await verifyPassword(user.passwordHash, password);
	if (!ok || user.disabledAt || !user.emailVerified) return null;
	return {
		id: user.id,
		email: user.email,
		name: user.name,
		role: user.role,
		sessionVersion: user.sessionVersion
	};
}

/**
 * Mails a reset link when the address has an active account; silent otherwise. Everything
 * that depends on the address runs after the answer, so known and unknown addresses take
 * the same time to answer (issue 12, item 8).
 */
export async function requestPasswordReset(email: string, origin: string): Promise<void> {
	runLater('password-reset', async () => {
		const user = await User.findOne({ where: { email, disabledAt: null } });
		if (!user) return;
		const token = await issueToken(user.id, 'reset_password', RESET_PASSWORD_MINUTES);
		mail.sendLater(
			user.email,
			templates.resetPassword({ url: `${origin}/reset/${token}`, minutes: RESET_PASSWORD_MINUTES })
		);
	});
}

/** Whether a reset token can still be used (for showing the form). */
export async function isResetTokenUsable(token: string): Promise<boolean> {
	const row = await EmailToken.findOne({
		where: { tokenHash: hashToken(token), purpose: 'reset_password' }
	});
	return Boolean(row && !row.usedAt && row.expiresAt.getTime() >= Date.now());
}

/**
 * Sets a new password from a reset link. Every session of the account ends (session
 * version bump), other reset links die, and the address counts as verified (the link
 * proved it).
 */
export async function resetPassword(token: string, password: string): Promise<'reset' | 'invalid'> {
	const passwordHash = await hashPassword(password);
	const email = await sequelize.transaction(async (transaction) => {
		const userId = await redeemToken(token, 'reset_password', transaction);
		if (!userId) return null;
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user || user.disabledAt) return null;
		await user.update(
			{
				passwordHash,
				sessionVersion: user.sessionVersion + 1,
				emailVerified: user.emailVerified ?? new Date()
			},
			{ transaction }
		);
		await EmailToken.update(
			{ usedAt: new Date() },
			// Other reset links die, and so does a pending e-mail change (the owner's way to stop one).
			{ where: { userId, purpose: ['reset_password', 'change_email'], usedAt: null }, transaction }
		);
		return user.email;
	});
	if (!email) return 'invalid';
	mail.sendLater(email, templates.passwordChanged({}));
	return 'reset';
}

export type ChangePasswordOutcome = { kind: 'ok' } | { kind: 'wrong_password' };

/**
 * Changes the password after checking the current one. Every session ends (session version
 * bump), and so do links still waiting in someone's inbox: reset links and a pending change
 * of address (issue 12, item 5), since whoever holds one may be the reason for the change.
 */
export async function changePassword(
	userId: string,
	current: string,
	next: string
): Promise<ChangePasswordOutcome> {
	const user = await User.findByPk(userId);
	if (!user?.passwordHash || !(await verifyPassword(user.passwordHash, current)))
		return { kind: 'wrong_password' };
	const passwordHash = await hashPassword(next);
	await sequelize.transaction(async (transaction) => {
		await User.update(
			{ passwordHash, sessionVersion: user.sessionVersion + 1 },
			{ where: { id: userId, sessionVersion: user.sessionVersion }, transaction }
		);
		await EmailToken.update(
			{ usedAt: new Date() },
			{ where: { userId, purpose: ['reset_password', 'change_email'], usedAt: null }, transaction }
		);
	});
	mail.sendLater(user.email, templates.passwordChanged({}));
	return { kind: 'ok' };
}

/**
 * Ends every session of the account at once, this one included: sign-out must invalidate a
 * session token on the server, not only delete the cookie, or a copied token lives on until
 * it expires (issue 12, item 5). It bumps the session version the jwt callback compares on
 * every request, so it signs the account out on every device.
 */
export async function endSessions(userId: string): Promise<void> {
	await User.increment('sessionVersion', { by: 1, where: { id: userId } });
}

export type EmailChangeOutcome =
	{ kind: 'ok' } | { kind: 'wrong_password' } | { kind: 'same_address' };

/**
 * Starts moving an account to a new address: a confirmation link goes to the new address
 * and a notice to the old one. A taken address gets the same answer and no link, so the
 * form cannot be used to find out who has an account; that check, the link and the mail
 * run after the answer, so the time it takes tells nothing either.
 */
export async function requestEmailChange(
	userId: string,
	input: { newEmail: string; password?: string },
	origin: string
): Promise<EmailChangeOutcome> {
	const user = await User.findByPk(userId);
	if (!user) return { kind: 'wrong_password' };
	if (user.passwordHash && !(await verifyPassword(user.passwordHash, input.password ?? ''))) {
		return { kind: 'wrong_password' };
	}
	if (input.newEmail === user.email) return { kind: 'same_address' };
	const oldEmail = user.email;
	runLater('email-change', async () => {
		if (await User.findOne({ where: { email: input.newEmail } })) return;
		const token = await issueToken(
			userId,
			'change_email',
			CHANGE_EMAIL_MINUTES,
			undefined,
			input.newEmail
		);
		mail.sendLater(
			input.newEmail,
			templates.confirmEmailChange({
				url: `${origin}/verify/email?token=${token}`,
				minutes: CHANGE_EMAIL_MINUTES
			})
		);
		mail.sendLater(oldEmail, templates.emailChangeRequested({ resetUrl: `${origin}/reset` }));
	});
	return { kind: 'ok' };
}

/** Moves the account to the confirmed address; 'taken' when someone claimed it meanwhile. */
export async function confirmEmailChange(token: string): Promise<'changed' | 'invalid' | 'taken'> {
	return sequelize.transaction(async (transaction) => {
		const row = await redeem(token, 'change_email', transaction);
		if (!row?.newEmail) return 'invalid';
		const taken = await User.findOne({ where: { email: row.newEmail }, transaction });
		if (taken) return 'taken';
		await User.update(
			{ email: row.newEmail, emailVerified: new Date() },
			{ where: { id: row.userId }, transaction }
		);
		return 'changed';
	});
}

export async function getAccount(userId: string): Promise<AccountView | null> {
	const user = await User.findByPk(userId);
	if (!user) return null;
	return {
		id: user.id,
		email: user.email,
		name: user.name,
		role: user.role,
		emailVerified: Boolean(user.emailVerified),
		hasPassword: Boolean(user.passwordHash),
		createdAt: user.createdAt.toISOString()
	};
}

export async function updateProfile(userId: string, input: { name: string }): Promise<void> {
	await User.update({ name: input.name }, { where: { id: userId } });
	// Guide lists show authors' names (http/list-caching.ts).
	await bumpGuideLists();
}

/**
 * Deletes the account and its personal data. Published guides stay, shown under
 * "former member" (guides.author_id is set to null by its foreign key).
 */
export async function deleteAccount(userId: string): Promise<void> {
	await sequelize.transaction(async (transaction) => {
		// Unpublished work is personal data; published guides are community content.
		await Guide.destroy({
			where: { authorId: userId, state: { [Op.ne]: 'published' } },
			transaction
		});
		await User.destroy({ where: { id: userId }, transaction });
	});
}

/** Whether a sign-in link may be sent to, or used for, this address: an enabled account has it. */
export async function canSignInByLink(email: string): Promise<boolean> {
	const user = await User.findOne({ where: { email, disabledAt: null }, attributes: ['id'] });
	return user !== null;
}

/** Session check on every request: the user's current role, or null to end the session. */
export async function sessionUser(id: string, sessionVersion: number) {
	const user = await User.findByPk(id, {
		attributes: ['id', 'email', 'name', 'role', 'sessionVersion', 'disabledAt']
	});
	if (!user || user.disabledAt || user.sessionVersion !== sessionVersion) return null;
	return { id: user.id, email: user.email, name: user.name, role: user.role };
}
