/**
 * Lists of builds without pricing, so they stay cheap: the reader's own builds and a guide's
 * lineage (how many forks, and the public ones).
 */
import { Build, BuildSlot, Guide, GuideRevision, Region, User } from '$lib/server/db';
import type { BuildCard, BuildVisibility, LineageView } from '$lib/views';
import type { LoadedBuild } from './build-pricing';
import { sourceView } from './build-view';
import { regionSummary } from './mappers';

/** The reader's builds, most recently changed first (no pricing: cards stay cheap). */
export async function listMine(ownerId: string): Promise<BuildCard[]> {
	const builds = (await Build.findAll({
		where: { ownerId },
		include: [
			{ model: Region, as: 'region' },
			{
				model: Guide,
				as: 'sourceGuide',
				include: [{ model: GuideRevision, as: 'publishedRevision', attributes: ['id', 'number'] }]
			},
			{ model: GuideRevision, as: 'baseRevision', attributes: ['id', 'number'] }
		],
		order: [['updatedAt', 'DESC']]
	})) as LoadedBuild[];
	if (builds.length === 0) return [];
	const slots = await BuildSlot.findAll({
		where: { buildId: builds.map((b) => b.id) },
		attributes: ['buildId', 'purchased']
	});
	return builds.map((b) => {
		const mine = slots.filter((s) => s.buildId === b.id);
		const source = sourceView(b);
		return {
			id: b.id,
			title: b.title,
			visibility: b.visibility as BuildVisibility,
			region: regionSummary(b.region),
			source: source ? { slug: source.slug, title: source.title } : null,
			slotCount: mine.length,
			boughtCount: mine.filter((s) => s.purchased).length,
			newerRevisionAvailable: source?.newerRevisionAvailable ?? false,
			hiddenReason: b.hiddenAt ? (b.hiddenReason ?? '') : null,
			updatedAt: b.updatedAt.toISOString()
		};
	});
}

/** How many builds were forked from a guide, and its public forks (most recent first, at most 50; hidden ones left out). */
export async function lineage(guideSlug: string): Promise<LineageView> {
	const guide = await Guide.findOne({ where: { slug: guideSlug }, attributes: ['id'] });
	if (!guide) return { forkCount: 0, publicBuilds: [] };
	return lineageOf(guide.id);
}

/** lineage() for a caller that already holds the guide's id (the guide page: no second guide read). */
export async function lineageOf(guideId: number): Promise<LineageView> {
	const guide = { id: guideId };
	const [forkCount, publicBuilds] = await Promise.all([
		Build.count({ where: { sourceGuideId: guide.id } }),
		Build.findAll({
			where: { sourceGuideId: guide.id, visibility: 'public', hiddenAt: null },
			include: [{ model: User, as: 'owner', attributes: ['name'] }],
			order: [
				['updatedAt', 'DESC'],
				['id', 'DESC']
			],
			limit: 50
		}) as Promise<LoadedBuild[]>
	]);
	return {
		forkCount,
		publicBuilds: publicBuilds.map((b) => ({
			id: b.id,
			title: b.title,
			ownerName: b.owner?.name ?? 'Former member',
			updatedAt: b.updatedAt.toISOString()
		}))
	};
}
