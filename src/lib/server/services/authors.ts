/**
 * Author pages (/authors/[handle]) and following. A page exists for an account that can
 * write (author, editor, admin) or has a published guide, and is not disabled; anyone else's
 * handle answers like one that does not exist. Counts only, never who: the page says how
 * many builds were forked from the author's guides and how many readers follow them.
 */
import { Op, UniqueConstraintError } from 'sequelize';
import { Build, Follow, Guide, GuideRevision, User } from '$lib/server/db';
import type { Outcome } from '$lib/schemas/issues';
import { paymentsAvailable } from '$lib/server/payments/provider';
import { getSettings as tipSettingsOf } from './tips';

const WRITING_ROLES = ['author', 'editor', 'admin'];

export interface AuthorGuide {
	slug: string;
	title: string;
	summary: string;
	tags: string[];
	publishedAt: string | null;
}

export interface AuthorPage {
	handle: string;
	name: string;
	bio: string | null;
	guides: AuthorGuide[];
	/** Builds forked from any of the author's guides, whatever their visibility. */
	forks: number;
	followers: number;
	/** null for visitors; whether the signed-in viewer follows this author. */
	following: boolean | null;
	/** The viewer is this author (no follow button on one's own page). */
	own: boolean;
	/** Readers may tip this author (issue 20): each guide then links its tip page. */
	tipsOpen: boolean;
}

function publishedWhere(authorId: string) {
	return { authorId, state: 'published', publishedRevisionId: { [Op.ne]: null }, hiddenAt: null };
}

/** The account behind a handle, when it has an author page. */
async function authorByHandle(handle: string): Promise<User | null> {
	const user = await User.findOne({ where: { handle, disabledAt: null } });
	if (!user) return null;
	if (WRITING_ROLES.includes(user.role)) return user;
	return (await Guide.count({ where: publishedWhere(user.id) })) > 0 ? user : null;
}

export async function authorPage(
	handle: string,
	viewerId: string | null
): Promise<AuthorPage | null> {
	const author = await authorByHandle(handle);
	if (!author) return null;
	const guides = (await Guide.findAll({
		where: publishedWhere(author.id),
		include: [{ model: GuideRevision, as: 'publishedRevision', attributes: ['publishedAt'] }],
		order: [['updatedAt', 'DESC']]
	})) as (Guide & { publishedRevision?: GuideRevision | null })[];
	const allGuideIds = (
		await Guide.findAll({ where: { authorId: author.id }, attributes: ['id'] })
	).map((g) => g.id);
	const [forks, followers, follow, tips] = await Promise.all([
		allGuideIds.length ? Build.count({ where: { sourceGuideId: allGuideIds } }) : 0,
		Follow.count({ where: { authorId: author.id } }),
		viewerId ? Follow.findOne({ where: { followerId: viewerId, authorId: author.id } }) : null,
		tipSettingsOf(author.id)
	]);
	return {
		handle: author.handle,
		name: author.name ?? 'A Slotwise author',
		bio: author.bio,
		guides: guides.map((g) => ({
			slug: g.slug,
			title: g.title,
			summary: g.summary,
			tags: g.tags ?? [],
			publishedAt: g.publishedRevision?.publishedAt?.toISOString() ?? null
		})),
		forks,
		followers,
		following: viewerId ? follow !== null : null,
		own: viewerId === author.id,
		tipsOpen: tips.tipsEnabled && paymentsAvailable() && guides.length > 0
	};
}

/** Follows an author; following twice is the same as once. */
export async function follow(viewerId: string, handle: string): Promise<Outcome> {
	const author = await authorByHandle(handle);
	if (!author) return { kind: 'not_found' };
	if (author.id === viewerId) return { kind: 'conflict', message: 'You cannot follow yourself.' };
	try {
		await Follow.findOrCreate({ where: { followerId: viewerId, authorId: author.id } });
	} catch (error) {
		if (!(error instanceof UniqueConstraintError)) throw error;
	}
	return { kind: 'ok' };
}

export async function unfollow(viewerId: string, handle: string): Promise<Outcome> {
	const author = await User.findOne({ where: { handle }, attributes: ['id'] });
	if (!author) return { kind: 'not_found' };
	await Follow.destroy({ where: { followerId: viewerId, authorId: author.id } });
	return { kind: 'ok' };
}

export interface FollowedAuthor {
	handle: string;
	name: string;
}

/** Who the user follows, for the account page. */
export async function followedBy(userId: string): Promise<FollowedAuthor[]> {
	const rows = (await Follow.findAll({
		where: { followerId: userId },
		include: [{ model: User, as: 'author', attributes: ['handle', 'name'] }],
		order: [['createdAt', 'DESC']]
	})) as (Follow & { author?: User | null })[];
	return rows.flatMap((r) =>
		r.author ? [{ handle: r.author.handle, name: r.author.name ?? r.author.handle }] : []
	);
}

/** Ids of the users who follow an author (for notices and mailings). */
export async function followerIds(authorId: string): Promise<string[]> {
	return (await Follow.findAll({ where: { authorId }, attributes: ['followerId'] })).map(
		(f) => f.followerId
	);
}

export interface AuthorProfile {
	handle: string;
	bio: string;
	/** Whether /authors/[handle] shows a page for this account. */
	hasPage: boolean;
}

export async function profileOf(userId: string): Promise<AuthorProfile | null> {
	const user = await User.findByPk(userId, {
		attributes: ['id', 'handle', 'bio', 'role', 'disabledAt']
	});
	if (!user) return null;
	return {
		handle: user.handle,
		bio: user.bio ?? '',
		hasPage: (await authorByHandle(user.handle)) !== null
	};
}

/** Saves handle and bio; a handle someone else has is a field error, not an overwrite. */
export async function updateProfile(
	userId: string,
	input: { handle: string; bio: string }
): Promise<Outcome> {
	const taken = await User.findOne({
		where: { handle: input.handle, id: { [Op.ne]: userId } },
		attributes: ['id']
	});
	if (taken) return { kind: 'invalid', issues: { handle: ['That handle is taken. Try another.'] } };
	try {
		const [affected] = await User.update(
			{ handle: input.handle, bio: input.bio || null },
			{ where: { id: userId } }
		);
		return affected === 1 ? { kind: 'ok' } : { kind: 'not_found' };
	} catch (error) {
		if (error instanceof UniqueConstraintError)
			return { kind: 'invalid', issues: { handle: ['That handle is taken. Try another.'] } };
		throw error;
	}
}
