/**
 * Guide galleries (docs/architecture.md "Gallery"): a revision's photos in assembly order,
 * each with a stage, caption and alt text. Gallery rows belong to a revision like its slots:
 * the draft's rows are written with the draft (services/guide-drafts.ts calls writeGallery in
 * its save transaction), a new revision starts from the input or a copy of the frozen one,
 * and readers see only the published revision's rows. The review page compares two
 * revisions' photos (galleryChanges).
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import {
	ASSEMBLY_STAGES,
	DEFER_TO_MANUALS,
	cautionsFor,
	isAssemblyStage,
	stageLabel
} from '$lib/domain/assembly-stages';
import type { GalleryItemInput } from '$lib/schemas/photos';
import { GalleryPhoto, Guide, GuideRevision, Photo } from '$lib/server/db';
import type { Issues } from '$lib/schemas/issues';
import { photoView } from './photo-views';
import type {
	GalleryChanges,
	GalleryEntry,
	GalleryItem,
	GalleryStageView,
	PhotoView,
	PublishedGallery
} from '$lib/views';

export type { GalleryChanges, GalleryEntry, GalleryItem, GalleryStageView, PublishedGallery };

type Row = GalleryPhoto & { photo?: Photo };

async function rowsOf(revisionIds: number[], transaction?: Transaction): Promise<Row[]> {
	if (revisionIds.length === 0) return [];
	return (await GalleryPhoto.findAll({
		where: { revisionId: revisionIds },
		include: [{ model: Photo, as: 'photo' }],
		order: [
			['position', 'ASC'],
			['id', 'ASC']
		],
		transaction
	})) as Row[];
}

const itemOf = (r: GalleryPhoto): GalleryItem => ({
	photoId: r.photoId,
	stage: isAssemblyStage(r.stage) ? r.stage : 'prepare-case',
	caption: r.caption,
	altText: r.altText
});

/** A revision's gallery as the editor's working copy starts from it. */
export async function galleryItems(
	revisionId: number,
	transaction?: Transaction
): Promise<GalleryItem[]> {
	return (await rowsOf([revisionId], transaction)).map(itemOf);
}

/** A revision's gallery with its photos (hidden photos, and any not yet processed, left out). */
export async function revisionGallery(revisionId: number): Promise<GalleryEntry[]> {
	return (await rowsOf([revisionId]))
		.filter((r) => r.photo && !r.photo.hiddenAt && r.photo.state === 'ready')
		.map((r) => ({ ...itemOf(r), photo: photoView(r.photo as Photo, r) }));
}

/** Every processed photo of an author's own guide, by id, for the editor (null: not their guide). */
export async function guidePhotos(
	authorId: string,
	slug: string
): Promise<Record<number, PhotoView> | null> {
	const guide = await Guide.findOne({ where: { slug, authorId }, attributes: ['id'] });
	if (!guide) return null;
	const photos = await Photo.findAll({
		where: { guideId: guide.id, state: 'ready' },
		order: [['id', 'ASC']]
	});
	return Object.fromEntries(photos.map((p) => [p.id, photoView(p)]));
}

/** Photo ids the input names that are not this guide's ready photos: field issues for the draft save. */
export async function checkGallery(guideId: number, items: GalleryItemInput[]): Promise<Issues> {
	if (items.length === 0) return {};
	const ids = new Set(
		(
			await Photo.findAll({
				where: { guideId, id: items.map((i) => i.photoId), state: 'ready' },
				attributes: ['id']
			})
		).map((p) => p.id)
	);
	const issues: Issues = {};
	items.forEach((item, i) => {
		if (!ids.has(item.photoId))
			issues[`gallery.${i}.photoId`] = [
				'This photo was deleted, is still being processed or belongs to another guide.'
			];
	});
	return issues;
}

/**
 * Writes a revision's gallery inside the draft's save transaction. `items` undefined (an API
 * client that does not send a gallery) keeps what is stored, and a new revision copies the
 * frozen revision's rows (`copyFrom`); sent, it replaces the rows in the given order.
 */
export async function writeGallery(
	revisionId: number,
	items: GalleryItemInput[] | undefined,
	copyFrom: number | null,
	transaction: Transaction
): Promise<void> {
	if (items === undefined) {
		if (copyFrom === null) return;
		const rows = await rowsOf([copyFrom], transaction);
		if (rows.length === 0) return;
		await GalleryPhoto.bulkCreate(
			rows.map((r) => ({
				revisionId,
				photoId: r.photoId,
				stage: r.stage,
				position: r.position,
				caption: r.caption,
				altText: r.altText
			})),
			{ transaction }
		);
		return;
	}
	await GalleryPhoto.destroy({ where: { revisionId }, transaction });
	if (items.length === 0) return;
	await GalleryPhoto.bulkCreate(
		items.map((item, i) => ({
			revisionId,
			photoId: item.photoId,
			stage: item.stage,
			position: i + 1,
			caption: item.caption,
			altText: item.altText
		})),
		{ transaction }
	);
}

/** Entries grouped by stage in assembly order, each stage with its cautions; empty stages left out. */
export function byStage(entries: readonly GalleryEntry[]): GalleryStageView[] {
	return ASSEMBLY_STAGES.flatMap(({ key }) => {
		const photos = entries.filter((e) => e.stage === key).map((e) => e.photo);
		return photos.length > 0
			? [{ stage: key, label: stageLabel(key), cautions: cautionsFor(key), photos }]
			: [];
	});
}

/**
 * The published revision's gallery for the guide page (the page itself decides who may see
 * the guide); null when the guide has no published revision.
 */
export async function publishedGallery(slug: string): Promise<PublishedGallery | null> {
	const guide = await Guide.findOne({ where: { slug }, attributes: ['publishedRevisionId'] });
	const publishedRevisionId = guide?.publishedRevisionId ?? null;
	return publishedRevisionId ? galleryOfRevision(publishedRevisionId) : null;
}

/** The gallery of a published revision whose id the caller has already read (the guide page's stamp). */
export async function galleryOfRevision(revisionId: number): Promise<PublishedGallery> {
	return { stages: byStage(await revisionGallery(revisionId)), deferToManuals: DEFER_TO_MANUALS };
}

/** New, removed and re-described photos between two revisions (the review page, beside the text diff). */
export async function galleryChanges(
	fromRevisionId: number | null,
	toRevisionId: number
): Promise<GalleryChanges> {
	const before = fromRevisionId ? await revisionGallery(fromRevisionId) : [];
	const after = await revisionGallery(toRevisionId);
	const beforeById = new Map(before.map((e) => [e.photoId, e]));
	const afterIds = new Set(after.map((e) => e.photoId));
	return {
		added: after.filter((e) => !beforeById.has(e.photoId)),
		removed: before.filter((e) => !afterIds.has(e.photoId)),
		changed: after.flatMap((e) => {
			const old = beforeById.get(e.photoId);
			return old &&
				(old.stage !== e.stage || old.caption !== e.caption || old.altText !== e.altText)
				? [{ before: old, after: e }]
				: [];
		})
	};
}

/**
 * The review page's photo changes for one revision: against the live revision, or, when this
 * revision is the live one, against the revision published before it.
 */
export async function reviewGalleryChanges(revisionId: number): Promise<GalleryChanges | null> {
	const revision = await GuideRevision.findByPk(revisionId, {
		attributes: ['id', 'guideId', 'number']
	});
	if (!revision) return null;
	const guide = await Guide.findByPk(revision.guideId, { attributes: ['publishedRevisionId'] });
	let from = guide?.publishedRevisionId ?? null;
	if (from === revision.id) {
		const previous = await GuideRevision.findOne({
			where: {
				guideId: revision.guideId,
				number: { [Op.lt]: revision.number },
				publishedAt: { [Op.ne]: null }
			},
			order: [['number', 'DESC']],
			attributes: ['id']
		});
		from = previous?.id ?? null;
	}
	return galleryChanges(from, revision.id);
}
