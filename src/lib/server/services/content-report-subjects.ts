/**
 * The kinds of content people may report (docs/architecture.md "Roles"): a small registry maps
 * each subject type to a handler that finds, describes, hides and restores that kind of
 * content. 'guide', 'build', 'photo' (a finished build's photo) and 'tip_note' (a supporter's
 * public note, content-report-tip-notes.ts) have handlers (the hidden
 * columns of guides, builds and photos are written only here). Adding one means writing its SubjectHandler
 * and putting it into SUBJECTS; the queue (content-report-queue.ts) and the decisions
 * (content-reports.ts) need no change.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { ReportSubjectType } from '$lib/domain/content-reports';
import { Build, Guide, Photo, User } from '$lib/server/db';
import type { SubjectSummary } from '$lib/views';
import { readerAccess } from './build-access';
import { tipNoteSubject } from './content-report-tip-notes';
import { wholeSecondNow } from './users';

export interface SubjectHandler {
	/**
	 * Locks the item's row for the rest of the transaction (false when it does not exist).
	 * Every decision takes this lock first, then the report rows: one lock order, so two
	 * editors deciding the same item queue instead of deadlocking on the reports' index gaps.
	 */
	lock(id: string, transaction: Transaction): Promise<boolean>;
	/**
	 * The item a reader may report, looked up by the key in its public URL (a guide's slug, a
	 * build's id). `reader` is who reports and what else their URL carried (an unlisted build's
	 * link token): what they may not see is not found.
	 */
	findReportable(
		key: string,
		transaction: Transaction,
		reader: { id: string; shareToken?: string }
	): Promise<{ id: string; ownerId: string | null } | null>;
	summaries(ids: string[]): Promise<Map<string, SubjectSummary>>;
	/** Hides the item if it is visible: 'ok', 'already' (hidden by someone else) or 'not_found'. */
	hide(
		id: string,
		reason: string,
		actorId: string,
		transaction: Transaction
	): Promise<'ok' | 'already' | 'not_found'>;
	/** Shows the item again; returns the reason it had been hidden for. */
	restore(
		id: string,
		transaction: Transaction
	): Promise<
		{ kind: 'ok'; reason: string | null } | { kind: 'not_hidden' } | { kind: 'not_found' }
	>;
}

const guideSubject: SubjectHandler = {
	async lock(id, transaction) {
		const guide = await Guide.findByPk(Number(id), {
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		return guide !== null;
	},

	async findReportable(slug, transaction) {
		// Only what the public can see is reportable: a published, visible guide.
		const guide = await Guide.findOne({
			where: { slug, state: 'published', publishedRevisionId: { [Op.ne]: null }, hiddenAt: null },
			attributes: ['id', 'authorId'],
			transaction
		});
		return guide ? { id: String(guide.id), ownerId: guide.authorId ?? null } : null;
	},

	async summaries(ids) {
		const rows = (await Guide.findAll({
			where: { id: ids.map(Number) },
			attributes: ['id', 'slug', 'title', 'hiddenAt', 'hiddenReason'],
			include: [{ model: User, as: 'author', attributes: ['name'] }]
		})) as (Guide & { author?: User | null })[];
		return new Map(
			rows.map((g) => [
				String(g.id),
				{
					type: 'guide' as const,
					id: String(g.id),
					title: g.title,
					url: `/guides/${g.slug}`,
					ownerName: g.author?.name ?? null,
					hidden: g.hiddenAt ? { reason: g.hiddenReason ?? '', at: g.hiddenAt.toISOString() } : null
				}
			])
		);
	},

	async hide(id, reason, actorId, transaction) {
		const [changed] = await Guide.update(
			{ hiddenAt: wholeSecondNow(), hiddenReason: reason, hiddenById: actorId },
			{ where: { id: Number(id), hiddenAt: null }, transaction, silent: true }
		);
		if (changed === 1) return 'ok';
		return (await Guide.count({ where: { id: Number(id) }, transaction })) > 0
			? 'already'
			: 'not_found';
	},

	async restore(id, transaction) {
		const guide = await Guide.findByPk(Number(id), {
			attributes: ['id', 'hiddenAt', 'hiddenReason'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!guide) return { kind: 'not_found' };
		const [changed] = await Guide.update(
			{ hiddenAt: null, hiddenReason: null, hiddenById: null },
			{ where: { id: guide.id, hiddenAt: { [Op.ne]: null } }, transaction, silent: true }
		);
		return changed === 1
			? { kind: 'ok', reason: guide.hiddenReason ?? null }
			: { kind: 'not_hidden' };
	}
};

/**
 * Builds: reportable by whoever may read them as a reader (build-access.ts readerAccess: the
 * owner, anyone for a public build, anyone with the link token for an unlisted one) and never
 * once hidden. A private build of someone else is not found (its existence is not revealed).
 * The owner is found, so `report` refuses their own build like an own guide. Editors open a
 * reported or hidden build whatever its visibility (build-access.ts buildAccess), so the
 * queue links unlisted ones with their token only for convenience.
 */
const buildSubject: SubjectHandler = {
	async lock(id, transaction) {
		const build = await Build.findByPk(Number(id), {
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		return build !== null;
	},

	async findReportable(key, transaction, reader) {
		if (!/^[1-9][0-9]{0,9}$/.test(key)) return null;
		const build = await Build.findOne({
			where: { id: Number(key), hiddenAt: null },
			attributes: ['id', 'ownerId', 'visibility', 'shareToken', 'hiddenAt'],
			transaction
		});
		if (!build) return null;
		const access = readerAccess(build, { id: reader.id }, reader.shareToken);
		return access ? { id: String(build.id), ownerId: build.ownerId } : null;
	},

	async summaries(ids) {
		const rows = (await Build.findAll({
			where: { id: ids.map(Number) },
			attributes: ['id', 'title', 'visibility', 'shareToken', 'hiddenAt', 'hiddenReason'],
			include: [{ model: User, as: 'owner', attributes: ['name'] }]
		})) as (Build & { owner?: User | null })[];
		return new Map(
			rows.map((b) => [
				String(b.id),
				{
					type: 'build' as const,
					id: String(b.id),
					title: b.title,
					url:
						b.visibility === 'unlisted'
							? `/builds/${b.id}?key=${encodeURIComponent(b.shareToken)}`
							: `/builds/${b.id}`,
					ownerName: b.owner?.name ?? null,
					hidden: b.hiddenAt ? { reason: b.hiddenReason ?? '', at: b.hiddenAt.toISOString() } : null
				}
			])
		);
	},

	async hide(id, reason, actorId, transaction) {
		// silent: hiding is not the owner's change (updatedAt and version stay as they were).
		const [changed] = await Build.update(
			{ hiddenAt: wholeSecondNow(), hiddenReason: reason, hiddenById: actorId },
			{ where: { id: Number(id), hiddenAt: null }, transaction, silent: true }
		);
		if (changed === 1) return 'ok';
		return (await Build.count({ where: { id: Number(id) }, transaction })) > 0
			? 'already'
			: 'not_found';
	},

	async restore(id, transaction) {
		const build = await Build.findByPk(Number(id), {
			attributes: ['id', 'hiddenAt', 'hiddenReason'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!build) return { kind: 'not_found' };
		const [changed] = await Build.update(
			{ hiddenAt: null, hiddenReason: null, hiddenById: null },
			{ where: { id: build.id, hiddenAt: { [Op.ne]: null } }, transaction, silent: true }
		);
		return changed === 1
			? { kind: 'ok', reason: build.hiddenReason ?? null }
			: { kind: 'not_hidden' };
	}
};

/**
 * Photos of finished builds (services/photos.ts): reportable by whoever may read the build
 * they belong to, keyed by the photo's id; hiding one takes it off the build page and stops
 * its files being served (/media checks it).
 */
const photoSubject: SubjectHandler = {
	async lock(id, transaction) {
		const photo = await Photo.findByPk(Number(id), {
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		return photo !== null;
	},

	async findReportable(key, transaction, reader) {
		if (!/^[1-9][0-9]{0,9}$/.test(key)) return null;
		const photo = await Photo.findOne({
			where: { id: Number(key), hiddenAt: null, buildId: { [Op.ne]: null } },
			attributes: ['id', 'ownerId', 'buildId'],
			transaction
		});
		if (!photo?.buildId) return null;
		const build = await buildSubject.findReportable(String(photo.buildId), transaction, reader);
		return build ? { id: String(photo.id), ownerId: photo.ownerId ?? null } : null;
	},

	async summaries(ids) {
		const rows = (await Photo.findAll({
			where: { id: ids.map(Number) },
			attributes: ['id', 'buildId', 'altText', 'hiddenAt', 'hiddenReason'],
			include: [
				{ model: User, as: 'owner', attributes: ['name'] },
				{ model: Build, as: 'build', attributes: ['id', 'title', 'visibility', 'shareToken'] }
			]
		})) as (Photo & { owner?: User | null; build?: Build | null })[];
		return new Map(
			rows.map((p) => [
				String(p.id),
				{
					type: 'photo' as const,
					id: String(p.id),
					title: `Photo of “${p.build?.title ?? 'a build'}”: ${p.altText}`,
					url: p.build
						? p.build.visibility === 'unlisted'
							? `/builds/${p.build.id}?key=${encodeURIComponent(p.build.shareToken)}`
							: `/builds/${p.build.id}`
						: '/',
					ownerName: p.owner?.name ?? null,
					hidden: p.hiddenAt ? { reason: p.hiddenReason ?? '', at: p.hiddenAt.toISOString() } : null
				}
			])
		);
	},

	async hide(id, reason, actorId, transaction) {
		const [changed] = await Photo.update(
			{ hiddenAt: wholeSecondNow(), hiddenReason: reason, hiddenById: actorId },
			{ where: { id: Number(id), hiddenAt: null }, transaction, silent: true }
		);
		if (changed === 1) return 'ok';
		return (await Photo.count({ where: { id: Number(id) }, transaction })) > 0
			? 'already'
			: 'not_found';
	},

	async restore(id, transaction) {
		const photo = await Photo.findByPk(Number(id), {
			attributes: ['id', 'hiddenAt', 'hiddenReason'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!photo) return { kind: 'not_found' };
		const [changed] = await Photo.update(
			{ hiddenAt: null, hiddenReason: null, hiddenById: null },
			{ where: { id: photo.id, hiddenAt: { [Op.ne]: null } }, transaction, silent: true }
		);
		return changed === 1
			? { kind: 'ok', reason: photo.hiddenReason ?? null }
			: { kind: 'not_hidden' };
	}
};

/** The registry: null would mark a subject type the schema knows but the product does not have yet. */
export const SUBJECTS: Record<ReportSubjectType, SubjectHandler | null> = {
	guide: guideSubject,
	build: buildSubject,
	photo: photoSubject,
	tip_note: tipNoteSubject
};

/** The handler of a subject type, or the conflict to answer while that kind of content does not exist. */
export function handlerFor(
	type: ReportSubjectType
): SubjectHandler | { kind: 'conflict'; message: string } {
	return (
		SUBJECTS[type] ?? {
			kind: 'conflict',
			message: `Reports on ${type}s are not open yet: that kind of content does not exist on Slotwise so far.`
		}
	);
}
