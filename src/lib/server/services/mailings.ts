/**
 * Mailings (docs/architecture.md "Mailing"): which approved revisions may be mailed, the
 * editor's draft (subject, intro, filters with defaults from the guide), and progress.
 * Sending (recipients, regional totals, preview, test, start) is in mailing-send.ts.
 *
 * A revision may be mailed once (UNIQUE mailings.revision_id) if it is its guide's first
 * published revision (a new guide) or one its author marked major, and it is still the live
 * revision of a published, visible guide.
 */
import { Op, QueryTypes, UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { MailingInput } from '$lib/schemas/newsletter';
import { Guide, GuideRevision, Mailing, Region, User, sequelize } from '$lib/server/db';
import type { MailingFilters, MailingStatus, MailingSummary } from '$lib/server/db/models/Mailing';
import type { Outcome } from '$lib/schemas/issues';

export type { MailingFilters, MailingSummary } from '$lib/server/db/models/Mailing';

type GuideRow = Guide & { author?: User | null; baseRegion?: Region | null };

export interface MailableRevision {
	revisionId: number;
	revisionNumber: number;
	slug: string;
	title: string;
	authorName: string;
	kind: 'new' | 'major';
	publishedAt: string;
}

export interface MailingListItem {
	id: number;
	status: MailingStatus;
	subject: string;
	guideTitle: string;
	recipients: number | null;
	createdAt: string;
	finishedAt: string | null;
}

export interface MailingView {
	id: number;
	status: MailingStatus;
	subject: string;
	intro: string;
	filters: MailingFilters;
	guide: { slug: string; title: string; authorName: string; baseRegion: string; tags: string[] };
	revisionNumber: number;
	kind: 'new' | 'major';
	testSentAt: string | null;
	startedAt: string | null;
	finishedAt: string | null;
	recipients: number | null;
	summary: MailingSummary | null;
}

export interface MailingProgress {
	status: MailingStatus;
	total: number;
	sent: number;
	failed: number;
	skipped: number;
	inDoubt: number;
	/** Queued or being sent. */
	remaining: number;
}

/** 'new' for a guide's first published revision, 'major' for one its author marked, else null. */
async function mailableKind(
	revision: GuideRevision,
	transaction?: Transaction
): Promise<'new' | 'major' | null> {
	// Published means an editor approved it (seeded demo revisions carry no decision row).
	if (!revision.publishedAt) return null;
	const earlier = await GuideRevision.count({
		where: {
			guideId: revision.guideId,
			number: { [Op.lt]: revision.number },
			publishedAt: { [Op.ne]: null }
		},
		transaction
	});
	if (earlier === 0) return 'new';
	return revision.major ? 'major' : null;
}

function isLive(guide: Guide, revisionId: number): boolean {
	return guide.state === 'published' && guide.publishedRevisionId === revisionId && !guide.hiddenAt;
}

/** Approved new guides and major revisions not mailed yet, newest first; and every mailing. */
export async function listMailings(): Promise<{
	ready: MailableRevision[];
	mailings: MailingListItem[];
}> {
	const live = (await Guide.findAll({
		where: { state: 'published', publishedRevisionId: { [Op.ne]: null }, hiddenAt: null },
		include: [
			{ model: User, as: 'author', attributes: ['name'] },
			{ model: GuideRevision, as: 'publishedRevision' }
		]
	})) as (GuideRow & { publishedRevision?: GuideRevision | null })[];
	const mailed = new Set(
		(await Mailing.findAll({ attributes: ['revisionId'] })).map((m) => m.revisionId)
	);
	const ready: MailableRevision[] = [];
	for (const guide of live) {
		const revision = guide.publishedRevision;
		if (!revision || mailed.has(revision.id)) continue;
		const kind = await mailableKind(revision);
		if (!kind) continue;
		ready.push({
			revisionId: revision.id,
			revisionNumber: revision.number,
			slug: guide.slug,
			title: guide.title,
			authorName: guide.author?.name ?? 'Former member',
			kind,
			publishedAt: (revision.publishedAt as Date).toISOString()
		});
	}
	ready.sort((a, b) => b.publishedAt.localeCompare(a.publishedAt));
	const rows = (await Mailing.findAll({
		include: [{ model: Guide, as: 'guide', attributes: ['title'] }],
		order: [['createdAt', 'DESC']],
		limit: 100
	})) as (Mailing & { guide?: Guide | null })[];
	return {
		ready,
		mailings: rows.map((m) => ({
			id: m.id,
			status: m.status,
			subject: m.subject,
			guideTitle: m.guide?.title ?? '',
			recipients: m.recipients,
			createdAt: m.createdAt.toISOString(),
			finishedAt: m.finishedAt?.toISOString() ?? null
		}))
	};
}

/** Starts a draft for a mailable revision, with defaults from the guide; an existing one is returned. */
export async function createMailing(
	actorId: string,
	revisionId: number
): Promise<Outcome<{ id: number }>> {
	const existing = await Mailing.findOne({ where: { revisionId } });
	if (existing) return { kind: 'ok', id: existing.id };
	const revision = await GuideRevision.findByPk(revisionId);
	if (!revision) return { kind: 'not_found' };
	const guide = (await Guide.findByPk(revision.guideId, {
		include: [{ model: Region, as: 'baseRegion', attributes: ['code'] }]
	})) as GuideRow | null;
	if (!guide) return { kind: 'not_found' };
	const kind = await mailableKind(revision);
	if (!kind || !isLive(guide, revision.id))
		return {
			kind: 'conflict',
			message:
				'Only the live revision of a new guide, or a revision its author marked major, can be mailed.'
		};
	try {
		const mailing = await Mailing.create({
			guideId: guide.id,
			revisionId: revision.id,
			createdById: actorId,
			subject: kind === 'new' ? `New guide: ${guide.title}` : `Updated guide: ${guide.title}`,
			intro:
				kind === 'new'
					? 'A new build guide has just been published on Slotwise.'
					: 'A guide you may know has had a major revision.',
			filters: {
				regions: guide.baseRegion ? [guide.baseRegion.code] : [],
				tags: [...(guide.tags ?? [])],
				followers: true
			}
		});
		return { kind: 'ok', id: mailing.id };
	} catch (error) {
		if (!(error instanceof UniqueConstraintError)) throw error;
		const winner = await Mailing.findOne({ where: { revisionId } });
		return winner ? { kind: 'ok', id: winner.id } : { kind: 'not_found' };
	}
}

export async function getMailing(id: number): Promise<MailingView | null> {
	const mailing = (await Mailing.findByPk(id, {
		include: [
			{
				model: Guide,
				as: 'guide',
				include: [
					{ model: User, as: 'author', attributes: ['name'] },
					{ model: Region, as: 'baseRegion', attributes: ['code'] }
				]
			},
			{ model: GuideRevision, as: 'revision' }
		]
	})) as (Mailing & { guide?: GuideRow | null; revision?: GuideRevision | null }) | null;
	if (!mailing?.guide || !mailing.revision) return null;
	return {
		id: mailing.id,
		status: mailing.status,
		subject: mailing.subject,
		intro: mailing.intro,
		filters: mailing.filters,
		guide: {
			slug: mailing.guide.slug,
			title: mailing.guide.title,
			authorName: mailing.guide.author?.name ?? 'Former member',
			baseRegion: mailing.guide.baseRegion?.code ?? '',
			tags: mailing.guide.tags ?? []
		},
		revisionNumber: mailing.revision.number,
		kind: (await mailableKind(mailing.revision)) ?? 'new',
		testSentAt: mailing.testSentAt?.toISOString() ?? null,
		startedAt: mailing.startedAt?.toISOString() ?? null,
		finishedAt: mailing.finishedAt?.toISOString() ?? null,
		recipients: mailing.recipients,
		summary: mailing.summary
	};
}

/** Edits a draft. Any change asks for a new test send before the mailing can start. */
export async function updateMailing(id: number, input: MailingInput): Promise<Outcome> {
	const known = new Set((await Region.findAll({ attributes: ['code'] })).map((r) => r.code));
	if (input.regions.some((r) => !known.has(r)))
		return { kind: 'invalid', issues: { regions: ['Choose regions from the list.'] } };
	const [affected] = await Mailing.update(
		{
			subject: input.subject,
			intro: input.intro,
			filters: {
				regions: [...new Set(input.regions)],
				tags: [...new Set(input.tags)],
				followers: input.followers
			},
			testSentAt: null
		},
		{ where: { id, status: 'draft' } }
	);
	if (affected === 1) return { kind: 'ok' };
	return (await Mailing.count({ where: { id } }))
		? { kind: 'conflict', message: 'This mailing has started; it can no longer be changed.' }
		: { kind: 'not_found' };
}

/** Sent, failed, skipped, in doubt and remaining, from the jobs themselves. */
export async function progress(id: number): Promise<MailingProgress | null> {
	const mailing = await Mailing.findByPk(id, { attributes: ['id', 'status'] });
	if (!mailing) return null;
	const counts = await sequelize.query<{ status: string; n: number }>(
		'SELECT status, COUNT(*) AS n FROM mail_jobs WHERE mailing_id = :id GROUP BY status',
		{ type: QueryTypes.SELECT, replacements: { id } }
	);
	const count = (s: string) => Number(counts.find((c) => c.status === s)?.n ?? 0);
	const total = counts.reduce((sum, c) => sum + Number(c.n), 0);
	return {
		status: mailing.status,
		total,
		sent: count('sent'),
		failed: count('failed'),
		skipped: count('skipped'),
		inDoubt: count('in_doubt'),
		remaining: count('queued') + count('sending')
	};
}

/**
 * Sends the jobs held `in_doubt` again, at the editor's explicit request: a recipient whose
 * copy did arrive before the worker stopped gets a second one. Only without a delivery check.
 */
export async function resendInDoubt(id: number): Promise<Outcome<{ count: number }>> {
	return sequelize.transaction(async (transaction) => {
		const mailing = await Mailing.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
		if (!mailing) return { kind: 'not_found' };
		const [, count] = await sequelize.query(
			`UPDATE mail_jobs SET status = 'queued', next_attempt_at = UTC_TIMESTAMP(3),
			 attempt_id = NULL, lease_until = NULL, updated_at = UTC_TIMESTAMP(3)
			 WHERE mailing_id = :id AND status = 'in_doubt'`,
			{ type: QueryTypes.UPDATE, replacements: { id }, transaction }
		);
		if (count > 0)
			await mailing.update({ status: 'sending', finishedAt: null, summary: null }, { transaction });
		return { kind: 'ok', count };
	});
}
