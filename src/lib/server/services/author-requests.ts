/**
 * Becoming an author: a reader asks with a short pitch, an editor or admin approves or
 * declines, and the reader hears by e-mail either way. The only module that reads or
 * writes author requests.
 *
 * Locking: every transaction here locks the requester's users row first and only then the
 * request row. One lock order for submit and decide means they queue instead of
 * deadlocking, two submits for one reader cannot both see "nothing pending", and two
 * editors deciding the same request at once are served one after the other: the second
 * sees the first one's decision and gets a conflict.
 */
import type { Role } from '$lib/domain/types';
import { AuthorRequest, User, sequelize } from '$lib/server/db';
import type { MyAuthorRequest, PendingAuthorRequest } from '$lib/views';
import * as mail from '$lib/server/mail';
import * as templates from '$lib/server/mail/templates';
import * as audit from './audit';
import type { Paged } from './audit';
import { wholeSecondNow } from './users';
import type { Outcome } from './users';
import { pageWindow } from './list-query';

export type { AuthorRequestState } from '$lib/server/db/models/AuthorRequest';

/** Pending requests listed per page for editors. */
export const PENDING_PER_PAGE = 25;

const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * Files a request for `userId` with an already validated pitch (see authorRequestInput).
 * Only readers may ask, and only while they have no request waiting.
 */
export async function submit(
	userId: string,
	pitch: string
): Promise<Outcome<{ request: MyAuthorRequest }>> {
	return sequelize.transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user) return { kind: 'not_found' } as const;
		if (user.role !== 'reader') {
			return {
				kind: 'conflict',
				message: `Your account already has the ${user.role} role.`
			} as const;
		}
		// A plain read is enough: it runs after the user lock is held, so it sees every
		// request committed by a submit that held the lock before us.
		const pending = await AuthorRequest.count({
			where: { userId, state: 'pending' },
			transaction
		});
		if (pending > 0) {
			return {
				kind: 'conflict',
				message:
					'You already have a request waiting for an editor. You will get an e-mail when it is decided.'
			} as const;
		}
		const request = await AuthorRequest.create(
			{ userId, pitch, state: 'pending' },
			{ transaction }
		);
		return { kind: 'ok', request: toMine(request) } as const;
	});
}

/** The user's most recent request (any state), or null when they never asked. */
export async function getMine(userId: string): Promise<MyAuthorRequest | null> {
	const request = await AuthorRequest.findOne({
		where: { userId },
		order: [
			['createdAt', 'DESC'],
			['id', 'DESC']
		]
	});
	return request ? toMine(request) : null;
}

/** Pending requests, oldest first (first come, first served), 25 per page. */
export async function listPending(options: {
	page: number;
	perPage?: number;
	now?: Date;
}): Promise<Paged<PendingAuthorRequest>> {
	const perPage = Math.min(Math.max(1, Math.trunc(options.perPage ?? PENDING_PER_PAGE)), 100);
	const now = options.now ?? new Date();
	const where = { state: 'pending' as const };
	const total = await AuthorRequest.count({ where });
	const window = pageWindow(total, options.page, perPage);
	const rows = (await AuthorRequest.findAll({
		where,
		include: [{ model: User, as: 'user', attributes: ['id', 'name', 'email', 'role'] }],
		order: [
			['createdAt', 'ASC'],
			['id', 'ASC']
		],
		limit: perPage,
		offset: window.offset
	})) as (AuthorRequest & { user: User })[];
	return {
		items: rows.map((row) => ({
			id: row.id,
			pitch: row.pitch,
			requester: {
				id: row.user.id,
				name: row.user.name,
				email: row.user.email,
				role: row.user.role
			},
			createdAt: row.createdAt.toISOString(),
			waitingDays: Math.max(0, Math.floor((now.getTime() - row.createdAt.getTime()) / DAY_MS))
		})),
		total,
		page: window.page,
		perPage,
		pageCount: window.pageCount
	};
}

/**
 * Approves or declines a pending request on behalf of editor/admin `actorId`. In one
 * transaction: the request's state, on approval the requester's role (reader → author)
 * with a session-version bump, and the audit events. The requester is e-mailed after the
 * commit, so a slow or failing mail server never holds locks or undoes a decision;
 * `mailed` says whether the message was accepted by the SMTP server.
 * A declined request needs a note (the reader receives it). `links.accountUrl` (absolute,
 * built by the route from the request's origin) becomes the e-mail's button.
 */
export async function decide(
	actorId: string,
	requestId: number,
	decision: { approve: boolean; note: string | null },
	links: { accountUrl?: string } = {}
): Promise<Outcome<{ request: MyAuthorRequest; mailed: boolean }>> {
	const note = decision.note?.trim() || null;
	if (!decision.approve && note === null) {
		return {
			kind: 'conflict',
			message: 'Say why the request is declined: the reader receives this note.'
		};
	}

	const result = await sequelize.transaction(async (transaction) => {
		// Unlocked look-up only to learn whose row to lock first (see the lock order above).
		const found = await AuthorRequest.findByPk(requestId, {
			attributes: ['id', 'userId'],
			transaction
		});
		if (!found) return { kind: 'not_found' } as const;
		const user = await User.findByPk(found.userId, { transaction, lock: transaction.LOCK.UPDATE });
		// A locking read returns the latest committed row, not this transaction's snapshot.
		const request = await AuthorRequest.findByPk(requestId, {
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!user || !request) return { kind: 'not_found' } as const;
		if (request.state !== 'pending') {
			return { kind: 'conflict', message: `This request was already ${request.state}.` } as const;
		}

		request.state = decision.approve ? 'approved' : 'declined';
		request.decidedById = actorId;
		request.decisionNote = note;
		request.decidedAt = wholeSecondNow();
		await request.save({ transaction });

		let roleAfter: Role = user.role;
		// Only a reader becomes an author: someone promoted further meanwhile keeps their role.
		if (decision.approve && user.role === 'reader') {
			// The role is re-read on every request: no sign-out needed for it to apply.
			const before = { role: user.role };
			user.role = 'author';
			await user.save({ transaction });
			roleAfter = user.role;
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
		}
		await audit.record(
			{
				actorId,
				action: decision.approve ? 'author_request.approved' : 'author_request.declined',
				subjectType: 'author_request',
				subjectId: request.id,
				before: { state: 'pending' },
				after: { state: request.state, decisionNote: note, requesterRole: roleAfter }
			},
			transaction
		);
		return {
			kind: 'ok',
			request: toMine(request),
			recipient: { email: user.email, name: user.name }
		} as const;
	});

	if (result.kind !== 'ok') return result;
	const mailed = await sendDecision(result.recipient, decision.approve, note, links.accountUrl);
	return { kind: 'ok', request: result.request, mailed };
}

async function sendDecision(
	recipient: { email: string; name: string | null },
	approved: boolean,
	note: string | null,
	url: string | undefined
): Promise<boolean> {
	try {
		await mail.send(
			recipient.email,
			templates.authorRequestDecision({ name: recipient.name ?? '', approved, note, url })
		);
		return true;
	} catch (error) {
		// The decision is committed either way; the editor is told the e-mail did not go out.
		// The address stays out of the log (personal data); the reason is enough to act on.
		console.error(
			JSON.stringify({
				t: new Date().toISOString(),
				kind: 'mail_failed',
				mail: 'author_request_decision',
				error: error instanceof Error ? { name: error.name, message: error.message } : String(error)
			})
		);
		return false;
	}
}

function toMine(request: AuthorRequest): MyAuthorRequest {
	return {
		id: request.id,
		state: request.state,
		pitch: request.pitch,
		decisionNote: request.decisionNote ?? null,
		createdAt: request.createdAt.toISOString(),
		decidedAt: request.decidedAt ? request.decidedAt.toISOString() : null
	};
}
