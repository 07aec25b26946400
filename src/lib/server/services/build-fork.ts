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
	const suffix = ' (my build)';
	const id = await sequelize.transaction(async (transaction) => {
		const build = await Build.create(
			{
				ownerId,
				sourceGuideId: guide.id,
				baseRevisionId: revisionId,
				title: `${guide.title.slice(0, 160 - suffix.length)}${suffix}`,
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
