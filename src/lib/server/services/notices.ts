/**
 * In-app notices under the bell, and which kinds also come by e-mail (docs/architecture.md
 * "Notice"). Kinds: a followed author published; a build's source guide has a new revision;
 * an author's revision was decided; the review queue gained an item.
 *
 * E-mail: for `author_published` and `queue_gained` this module queues the message itself
 * (server/mail/queue). `source_revised` and `revision_decided` already had their own e-mails
 * (build-notify.ts, review-mail.ts); those senders ask `emailWanted` first, so one switch on
 * the account page governs each kind.
 */
import { Op } from 'sequelize';
import { Notice, NoticeSetting, User, sequelize } from '$lib/server/db';
import { NOTICE_KINDS, type NoticeKind } from '$lib/server/db/models/Notice';
import { noticeMail } from '$lib/server/mail/newsletter-templates';
import { enqueueMessage } from '$lib/server/mail/queue';
import { pokeInlineWorker } from '$lib/server/mail/queue/inline';

export { NOTICE_KINDS, type NoticeKind } from '$lib/server/db/models/Notice';

export const NOTICE_KIND_LABELS: Record<NoticeKind, string> = {
	author_published: 'An author you follow publishes a guide',
	source_revised: 'A guide one of your builds came from gets a new revision',
	revision_decided: 'An editor decides on a revision you submitted',
	queue_gained: 'The review queue gains a revision (editors)'
};

/** Without a saved choice: in-app always; e-mail where it was sent before notices existed. */
const DEFAULTS: Record<NoticeKind, { inApp: boolean; email: boolean }> = {
	author_published: { inApp: true, email: false },
	source_revised: { inApp: true, email: true },
	revision_decided: { inApp: true, email: true },
	queue_gained: { inApp: true, email: false }
};

/** Kinds whose e-mail this module sends (the other two have their own mailers). */
const MAILED_HERE = new Set<NoticeKind>(['author_published', 'queue_gained']);

export type NoticeSettings = Record<NoticeKind, { inApp: boolean; email: boolean }>;

export async function settingsOf(userId: string): Promise<NoticeSettings> {
	const rows = await NoticeSetting.findAll({ where: { userId } });
	const out = structuredClone(DEFAULTS);
	for (const r of rows)
		if ((NOTICE_KINDS as readonly string[]).includes(r.kind))
			out[r.kind] = { inApp: r.inApp, email: r.email };
	return out;
}

export async function saveSettings(userId: string, settings: NoticeSettings): Promise<void> {
	await sequelize.transaction(async (transaction) => {
		for (const kind of NOTICE_KINDS) {
			await NoticeSetting.upsert(
				{ userId, kind, inApp: settings[kind].inApp, email: settings[kind].email },
				{ transaction }
			);
		}
	});
}

/** Of the given users, who want `kind` in-app and who by e-mail (saved choices over defaults). */
async function wants(userIds: string[], kind: NoticeKind) {
	const rows = userIds.length
		? await NoticeSetting.findAll({ where: { userId: userIds, kind } })
		: [];
	const saved = new Map(rows.map((r) => [r.userId, r]));
	const inApp = new Set<string>();
	const email = new Set<string>();
	for (const id of userIds) {
		const s = saved.get(id) ?? DEFAULTS[kind];
		if (s.inApp) inApp.add(id);
		if (s.email) email.add(id);
	}
	return { inApp, email };
}

/** The users among `userIds` who want e-mail for `kind` (build-notify and review mail ask). */
export async function emailWanted(userIds: string[], kind: NoticeKind): Promise<Set<string>> {
	return (await wants(userIds, kind)).email;
}

export interface NoticeInput {
	userId: string;
	message: string;
	/** Same-site path: "/guides/…". */
	linkPath: string;
}

/**
 * Files notices of one kind, each to its user as they chose; e-mail for the kinds mailed
 * here. Never throws: a notice is a courtesy, the change it reports has already happened.
 */
export async function notify(
	kind: NoticeKind,
	items: NoticeInput[],
	origin: string
): Promise<number> {
	try {
		const byUser = items.filter((i) => i.linkPath.startsWith('/') && !i.linkPath.startsWith('//'));
		const users = await User.findAll({
			where: { id: [...new Set(byUser.map((i) => i.userId))], disabledAt: null },
			attributes: ['id', 'email']
		});
		const active = new Map(users.map((u) => [u.id, u]));
		const { inApp, email } = await wants([...active.keys()], kind);
		let filed = 0;
		await sequelize.transaction(async (transaction) => {
			const rows = byUser.filter((i) => active.has(i.userId) && inApp.has(i.userId));
			if (rows.length) {
				const created = await Notice.bulkCreate(
					rows.map((i) => ({
						userId: i.userId,
						kind,
						message: i.message.slice(0, 300),
						linkPath: i.linkPath
					})),
					{ transaction }
				);
				filed = created.length;
			}
			if (!MAILED_HERE.has(kind)) return;
			for (const i of byUser) {
				const user = active.get(i.userId);
				if (!user || !email.has(i.userId)) continue;
				await enqueueMessage(
					{
						to: user.email,
						message: noticeMail({
							message: i.message,
							url: new URL(i.linkPath, origin).href,
							settingsUrl: new URL('/account#notices', origin).href
						})
					},
					transaction
				);
			}
		});
		pokeInlineWorker();
		return filed;
	} catch (error) {
		console.error(
			JSON.stringify({
				t: new Date().toISOString(),
				kind: 'notice_failed',
				notice: kind,
				error: String(error)
			})
		);
		return 0;
	}
}

export interface NoticeView {
	id: number;
	kind: NoticeKind;
	message: string;
	linkPath: string;
	read: boolean;
	createdAt: string;
}

export const NOTICES_PER_PAGE = 30;

export async function unreadCount(userId: string): Promise<number> {
	return Notice.count({ where: { userId, readAt: null } });
}

export async function list(
	userId: string,
	page: number
): Promise<{
	items: NoticeView[];
	total: number;
	unread: number;
	page: number;
	pageCount: number;
}> {
	const total = await Notice.count({ where: { userId } });
	const pageCount = Math.max(1, Math.ceil(total / NOTICES_PER_PAGE));
	const current = Math.min(Math.max(1, page), pageCount);
	const rows = await Notice.findAll({
		where: { userId },
		order: [
			['createdAt', 'DESC'],
			['id', 'DESC']
		],
		limit: NOTICES_PER_PAGE,
		offset: (current - 1) * NOTICES_PER_PAGE
	});
	return {
		items: rows.map((n) => ({
			id: n.id,
			kind: n.kind,
			message: n.message,
			linkPath: n.linkPath,
			read: n.readAt !== null,
			createdAt: n.createdAt.toISOString()
		})),
		total,
		unread: await unreadCount(userId),
		page: current,
		pageCount
	};
}

/** Marks one of the user's notices read (another user's id changes nothing); returns its link. */
export async function markRead(userId: string, id: number, read = true): Promise<string | null> {
	const notice = await Notice.findOne({ where: { id, userId } });
	if (!notice) return null;
	await notice.update({ readAt: read ? (notice.readAt ?? new Date()) : null });
	return notice.linkPath;
}

export async function markAllRead(userId: string): Promise<number> {
	const [affected] = await Notice.update(
		{ readAt: new Date() },
		{ where: { userId, readAt: { [Op.is]: null } } }
	);
	return affected;
}
