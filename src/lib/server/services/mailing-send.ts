/**
 * Sending a mailing: who gets it, what their copy says, and the start. Recipients are the
 * confirmed subscribers the audience rules admit (domain/newsletter-audience.ts); each copy
 * shows the guide's picks total in the recipient's home region and currency, priced once per
 * region through the shared guide pricing. Starting queues one job per recipient in the same
 * transaction that marks the mailing `sending`; the mail worker does the rest.
 */
import { formatMoney } from '$lib/domain/money';
import { audienceReason, type AudienceReason } from '$lib/domain/newsletter-audience';
import type { Money } from '$lib/domain/types';
import { Guide, Mailing, Region, Subscriber, User, sequelize } from '$lib/server/db';
import type { MailTemplate } from '$lib/server/mail';
import {
	enqueueMailingJobs,
	enqueueMessage,
	renderMailing,
	type MailingPayload
} from '$lib/server/mail/queue';
import { pokeInlineWorker } from '$lib/server/mail/queue/inline';
import { issueLink } from '$lib/server/newsletter/links';
import * as audit from './audit';
import { followerIds } from './authors';
import type { Outcome } from '$lib/schemas/issues';
import * as pricing from './pricing';

export interface RegionTotal {
	regionCode: string;
	regionName: string;
	total: Money | null;
	totalText: string | null;
	quoted: number;
	estimated: number;
	unpriced: number;
}

/**
 * The guide's picks total in one region, through the one pricing service (services/pricing.ts),
 * so a mail shows the figure the guide page shows there. Null when the guide has no published
 * revision or the region is unknown.
 */
export async function totalIn(slug: string, regionCode: string): Promise<RegionTotal | null> {
	const [guide, region] = await Promise.all([
		Guide.findOne({ where: { slug }, attributes: ['id', 'publishedRevisionId'] }),
		Region.findOne({ where: { code: regionCode } })
	]);
	if (!guide?.publishedRevisionId || !region) return null;
	const run = await pricing.priceRevisions([guide.publishedRevisionId], region);
	const priced = run.revisions.get(guide.publishedRevisionId);
	if (!priced) return null;
	const { picksTotal, picks } = priced.adjustment;
	return {
		regionCode: region.code,
		regionName: region.name,
		total: picksTotal,
		totalText: picksTotal ? formatMoney(picksTotal) : null,
		quoted: picks.quoted,
		estimated: picks.estimated,
		unpriced: picks.unpriced
	};
}

interface Recipient {
	subscriberId: number;
	email: string;
	linkVersion: number;
	regionCode: string;
	reason: Exclude<AudienceReason, null>;
}

async function loadMailing(id: number) {
	return (await Mailing.findByPk(id, {
		include: [{ model: Guide, as: 'guide', include: [{ model: Region, as: 'baseRegion' }] }]
	})) as (Mailing & { guide?: Guide & { baseRegion?: Region | null } }) | null;
}

/** Everyone the mailing would reach now, with the total priced once per home region. */
async function recipientsOf(mailing: Mailing & { guide?: Guide }) {
	const guide = mailing.guide;
	if (!guide) return null;
	const [subscribers, regions, followers] = await Promise.all([
		Subscriber.findAll({
			where: { status: 'confirmed' },
			attributes: [
				'id',
				'email',
				'userId',
				'homeRegionId',
				'regions',
				'tags',
				'budgetMinMinor',
				'budgetMaxMinor',
				'audience',
				'linkVersion'
			]
		}),
		Region.findAll({ attributes: ['id', 'code'] }),
		guide.authorId ? followerIds(guide.authorId) : Promise.resolve([])
	]);
	const codeOf = new Map(regions.map((r) => [r.id, r.code]));
	const following = new Set(followers);
	const totals = new Map<string, RegionTotal | null>();
	for (const code of new Set(subscribers.map((s) => codeOf.get(s.homeRegionId) ?? ''))) {
		if (code) totals.set(code, await totalIn(guide.slug, code));
	}
	const list: Recipient[] = [];
	for (const s of subscribers) {
		const code = codeOf.get(s.homeRegionId) ?? '';
		const priced = totals.get(code);
		if (!priced) continue;
		const reason = audienceReason(
			{
				regions: s.regions ?? [],
				tags: s.tags ?? [],
				budgetMinMinor: s.budgetMinMinor,
				budgetMaxMinor: s.budgetMaxMinor,
				audience: s.audience,
				followsAuthor: s.userId !== null && following.has(s.userId)
			},
			mailing.filters,
			priced.total
		);
		if (reason)
			list.push({
				subscriberId: s.id,
				email: s.email,
				linkVersion: s.linkVersion,
				regionCode: code,
				reason
			});
	}
	return { list, totals };
}

export interface AudienceCount {
	total: number;
	byPreferences: number;
	asFollowers: number;
	regions: { regionCode: string; regionName: string; count: number; totalText: string | null }[];
}

/** How many would get the mailing if it started now, per region with that region's total. */
export async function audienceCount(id: number): Promise<AudienceCount | null> {
	const mailing = await loadMailing(id);
	if (!mailing) return null;
	const found = await recipientsOf(mailing);
	if (!found) return null;
	const perRegion = new Map<string, number>();
	for (const r of found.list) perRegion.set(r.regionCode, (perRegion.get(r.regionCode) ?? 0) + 1);
	return {
		total: found.list.length,
		byPreferences: found.list.filter((r) => r.reason === 'preferences').length,
		asFollowers: found.list.filter((r) => r.reason === 'follows').length,
		regions: [...perRegion].map(([code, count]) => {
			const t = found.totals.get(code);
			return {
				regionCode: code,
				regionName: t?.regionName ?? code,
				count,
				totalText: t?.totalText ?? null
			};
		})
	};
}

function payloadFor(
	t: RegionTotal,
	s: { subscriberId: number; linkVersion: number } | null
): MailingPayload {
	return {
		regionCode: t.regionCode,
		regionName: t.regionName,
		totalText: t.totalText,
		quoted: t.quoted,
		estimated: t.estimated,
		unpriced: t.unpriced,
		// A preview or test copy belongs to no subscriber: its links lead to the newsletter page.
		manageToken: s ? issueLink('manage', s.subscriberId, s.linkVersion).token : 'preview',
		unsubscribeToken: s ? issueLink('unsubscribe', s.subscriberId, s.linkVersion).token : 'preview'
	};
}

function contentOf(mailing: Mailing & { guide?: Guide }, authorName: string, origin: string) {
	const guide = mailing.guide as Guide;
	return {
		subject: mailing.subject,
		intro: mailing.intro,
		origin,
		guide: { slug: guide.slug, title: guide.title, summary: guide.summary, authorName }
	};
}

async function authorNameOf(guide: Guide): Promise<string> {
	const author = guide.authorId
		? await User.findByPk(guide.authorId, { attributes: ['name'] })
		: null;
	return author?.name ?? 'a Slotwise author';
}

/** A copy as a recipient in `regionCode` would get it (links are placeholders). */
export async function preview(
	id: number,
	regionCode: string | null,
	origin: string
): Promise<{ message: MailTemplate; headers: Record<string, string>; region: RegionTotal } | null> {
	const mailing = await loadMailing(id);
	if (!mailing?.guide) return null;
	const code = regionCode ?? mailing.guide.baseRegion?.code ?? '';
	const total = await totalIn(mailing.guide.slug, code);
	if (!total) return null;
	const composed = renderMailing(
		contentOf(mailing, await authorNameOf(mailing.guide), origin),
		payloadFor(total, null)
	);
	return { message: composed.message, headers: composed.headers ?? {}, region: total };
}

/** Queues a test copy to the editor's own address; starting needs one after the last edit. */
export async function sendTest(
	id: number,
	actor: { id: string; email: string },
	regionCode: string | null,
	origin: string
): Promise<Outcome> {
	const copy = await preview(id, regionCode, origin);
	if (!copy) return { kind: 'not_found' };
	const outcome = await sequelize.transaction(async (transaction): Promise<Outcome> => {
		const mailing = await Mailing.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
		if (!mailing) return { kind: 'not_found' };
		if (mailing.status !== 'draft')
			return { kind: 'conflict', message: 'This mailing has started already.' };
		await enqueueMessage(
			{
				to: actor.email,
				message: { ...copy.message, subject: `[Test] ${copy.message.subject}` },
				headers: copy.headers
			},
			transaction
		);
		await mailing.update({ testSentAt: new Date() }, { transaction });
		return { kind: 'ok' };
	});
	pokeInlineWorker();
	return outcome;
}

/**
 * Starts the mailing: one job per recipient, queued in the transaction that marks it
 * `sending`, so a failure leaves a draft and no job. Needs a test send after the last edit.
 */
export async function start(
	id: number,
	actorId: string,
	origin: string
): Promise<Outcome<{ recipients: number }>> {
	const mailing = await loadMailing(id);
	if (!mailing?.guide) return { kind: 'not_found' };
	if (mailing.status !== 'draft')
		return { kind: 'conflict', message: 'This mailing has started already.' };
	if (!mailing.testSentAt)
		return { kind: 'invalid', issues: { _form: ['Send yourself a test copy first.'] } };
	const found = await recipientsOf(mailing);
	if (!found) return { kind: 'not_found' };
	const outcome = await sequelize.transaction(
		async (transaction): Promise<Outcome<{ recipients: number }>> => {
			const locked = await Mailing.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
			if (!locked) return { kind: 'not_found' };
			if (locked.status !== 'draft' || !locked.testSentAt)
				return {
					kind: 'conflict',
					message: 'This mailing changed or started meanwhile; reload it.'
				};
			await enqueueMailingJobs(
				id,
				found.list.map((r) => ({
					subscriberId: r.subscriberId,
					to: r.email,
					payload: payloadFor(
						found.totals.get(r.regionCode) as RegionTotal,
						r
					) as unknown as Record<string, unknown>
				})),
				transaction
			);
			const now = new Date();
			const empty = found.list.length === 0;
			await locked.update(
				{
					status: empty ? 'finished' : 'sending',
					recipients: found.list.length,
					startedAt: now,
					linkOrigin: origin,
					...(empty
						? { finishedAt: now, summary: { sent: 0, failed: 0, skipped: 0, inDoubt: 0 } }
						: {})
				},
				{ transaction }
			);
			await audit.record(
				{
					actorId,
					action: 'mailing.started',
					subjectType: 'mailing',
					subjectId: id,
					before: { status: 'draft' },
					after: { status: empty ? 'finished' : 'sending', recipients: found.list.length }
				},
				transaction
			);
			return { kind: 'ok', recipients: found.list.length };
		}
	);
	pokeInlineWorker();
	return outcome;
}
