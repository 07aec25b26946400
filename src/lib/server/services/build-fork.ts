/**
 * Forking (docs/architecture.md "Build"): a reader copies a guide's published revision into a
 * build of their own, private until they share it, linked to its source slot by slot.
 */
import { randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import { Build, BuildSlot, Guide, sequelize } from '$lib/server/db';
import { loadBuildSource } from './build-source';

/** 32 random bytes, base64url: 43 characters, the unguessable part of an unlisted build's link. */
export function newShareToken(): string {
	return randomBytes(32).toString('base64url');
}

/**
 * Copies the guide's published revision into a new private build owned by `ownerId`, in
 * the guide's base region, in one transaction (the build row and every slot, or nothing).
 * Hidden, unpublished or unknown guides: not_found.
 */
export async function fork(
	ownerId: string,
	guideSlug: string
): Promise<{ kind: 'created'; id: number } | { kind: 'not_found' }> {
	const guide = await Guide.findOne({
		where: {
			slug: guideSlug,
			state: 'published',
			publishedRevisionId: { [Op.ne]: null },
			hiddenAt: null
		}
	});
	if (!guide || guide.publishedRevisionId === null) return { kind: 'not_found' };
	const revisionId = guide.publishedRevisionId;
	const { slots } = await loadBuildSource(revisionId);
	const id = await sequelize.transaction(async (transaction) => {
		const taken = new Set(
			(
				await Build.findAll({
					where: { ownerId, sourceGuideId: guide.id },
					attributes: ['title'],
					transaction
				})
			).map((b) => b.title)
		);
		const build = await Build.create(
			{
				ownerId,
				sourceGuideId: guide.id,
				baseRevisionId: revisionId,
				title: forkTitle(guide.title, taken),
				regionId: guide.baseRegionId,
				visibility: 'private',
				shareToken: newShareToken(),
				notes: ''
			},
			{ transaction }
		);
		await BuildSlot.bulkCreate(
			slots.map(({ key, slot }, i) => ({
				buildId: build.id,
				sourceSlotKey: key,
				category: slot.category,
				label: slot.label,
				position: i + 1,
				partId: slot.pickPartId,
				quantity: slot.quantity,
				origin: 'source' as const
			})),
			{ transaction }
		);
		return build.id;
	});
	return { kind: 'created', id };
}

/**
 * "Title (my build)", then "Title (my build 2)", "(my build 3)"… for repeated forks of one
 * guide, so the owner can tell them apart in My builds; the first free number is used.
 */
function forkTitle(guideTitle: string, taken: ReadonlySet<string>): string {
	for (let n = 1; ; n++) {
		const suffix = n === 1 ? ' (my build)' : ` (my build ${n})`;
		const title = `${guideTitle.slice(0, 160 - suffix.length)}${suffix}`;
		if (!taken.has(title)) return title;
	}
}

/** Deletes the owner's build with its slots and update history (the foreign keys cascade). */
export async function deleteBuild(
	ownerId: string,
	id: number
): Promise<{ kind: 'deleted'; title: string } | { kind: 'not_found' }> {
	return sequelize.transaction(async (transaction) => {
		const build = await Build.findOne({ where: { id, ownerId }, transaction });
		if (!build) return { kind: 'not_found' as const };
		await build.destroy({ transaction });
		return { kind: 'deleted' as const, title: build.title };
	});
}
