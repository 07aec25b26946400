/**
 * The review page of one submitted revision (docs/architecture.md "Review queue"): its slots,
 * the diff against the live revision (and against the one last sent back), fit report with
 * the editors' pairing cautions, power budget, automatic flags and the moderation log.
 */
import { Op } from 'sequelize';
import { fitReport, summarize } from '$lib/domain/fit';
import { pairingCautions } from '$lib/domain/pairing-cautions';
import { powerBudget } from '$lib/domain/power';
import { reviewFlags } from '$lib/domain/review-flags';
import { revisionDiff } from '$lib/domain/revision-diff';
import { Guide, GuideRevision, Store, User } from '$lib/server/db';
import type { ReviewPage } from '$lib/views';
import { activeRules } from './caution-rules';
import type { Actor } from './guide-reviews';
import { reviewProposals } from './guide-price-proposals';
import { partName } from './mappers';
import { reviewLog } from './review-queue';
import {
	buildPartsOf,
	emptySnapshot,
	loadRevisionSlots,
	quoteText,
	slotPrice,
	snapshotOf
} from './revision-snapshots';

type RevisionWithGuide = GuideRevision & { guide: Guide & { author?: User | null } };

/** Everything an editor needs to decide on one revision, or null when there is no such submitted revision. */
export async function getReview(
	actor: Actor,
	revisionId: number,
	siteHost: string,
	now = new Date()
): Promise<ReviewPage | null> {
	const revision = (await GuideRevision.findByPk(revisionId, {
		include: [
			{
				model: Guide,
				as: 'guide',
				include: [{ model: User, as: 'author', attributes: ['name', 'email'] }]
			}
		]
	})) as RevisionWithGuide | null;
	if (!revision || !revision.submittedAt) return null;
	const guide = revision.guide;
	const live =
		guide.publishedRevisionId && guide.publishedRevisionId !== revision.id
			? await GuideRevision.findByPk(guide.publishedRevisionId)
			: null;
	const sentBack = await GuideRevision.findOne({
		where: { guideId: guide.id, decision: 'request_changes', number: { [Op.lt]: revision.number } },
		order: [['number', 'DESC']]
	});
	const compareSentBack = sentBack && (!live || sentBack.number > live.number) ? sentBack : null;
	const slots = await loadRevisionSlots([
		revision.id,
		...(live ? [live.id] : []),
		...(compareSentBack ? [compareSentBack.id] : [])
	]);
	const own = slots.filter((s) => s.revisionId === revision.id);
	const current = snapshotOf(revision, slots, true);
	const build = buildPartsOf(own);
	// The editors' pairing cautions count here as on the public page.
	const findings = [...fitReport(build), ...pairingCautions(build, await activeRules())];
	const stores = await Store.findAll({ attributes: ['url'] });
	const proposals = await reviewProposals(
		revision.id,
		new Map(own.map((s) => [s.position, s.label])),
		now
	);
	const knownHosts = [
		siteHost.split(':')[0] ?? siteHost,
		...stores.flatMap((s) => (s.url ? [hostOf(s.url)] : [])).filter((h): h is string => h !== null)
	];

	return {
		revisionId: revision.id,
		revisionNumber: revision.number,
		guide: {
			slug: guide.slug,
			// The revision under review's details, not the live copy on the guide row.
			title: revision.title,
			summary: revision.summary,
			state: guide.state,
			authorName: guide.author?.name ?? 'Former member',
			live: guide.state === 'published' && guide.publishedRevisionId !== null,
			disclosure: revision.disclosure,
			disclosureNote: revision.disclosureNote
		},
		isLiveRevision: guide.publishedRevisionId === revision.id && guide.state === 'published',
		submittedAt: revision.submittedAt.toISOString(),
		status: revision.reviewedAt ? (revision.decision ?? 'approve') : 'pending',
		slots: own.map((s) => ({
			key: s.slotKey,
			label: s.label,
			category: s.category,
			pick: partName(s.pick),
			quantity: s.quantity,
			reason: s.reason,
			price: quoteText(slotPrice(s)),
			alternates: s.alternates.map((a) => partName(a.part))
		})),
		priceProposals: proposals,
		diff: revisionDiff(live ? snapshotOf(live, slots, true) : emptySnapshot(), current),
		sinceLastReview: compareSentBack
			? revisionDiff(snapshotOf(compareSentBack, slots, true), current)
			: null,
		fit: {
			findings,
			summary: summarize(findings),
			slotLabels: Object.fromEntries(build.map((b) => [b.key, b.label]))
		},
		power: powerBudget(build),
		flags: reviewFlags({
			disclosure: { kind: revision.disclosure ?? null, note: revision.disclosureNote },
			buildNotesMd: revision.buildNotesMd,
			walkthroughUrl: revision.walkthroughUrl,
			knownHosts,
			quotes: own.flatMap((s) => {
				const price = slotPrice(s);
				return price
					? [{ slotLabel: s.label, observedAt: price.observedAt.toISOString(), url: price.url }]
					: [];
			}),
			conflicts: findings.filter((f) => f.severity === 'conflict'),
			now
		}),
		log: await reviewLog(guide.id),
		ownGuide: guide.authorId === actor.id,
		canDecide: !revision.reviewedAt && (guide.authorId !== actor.id || actor.role === 'admin')
	};
}

function hostOf(url: string): string | null {
	try {
		return new URL(url).hostname.toLowerCase();
	} catch {
		return null;
	}
}
