/**
 * Photo uploads and deletions for the three things a photo can illustrate: a guide (by its
 * author; placed in the gallery of a revision by services/gallery.ts), a catalog part (by
 * editors) and a public build (by its owner). Every upload runs the same pipeline
 * (images/pipeline.ts) and counts against its owner's storage quota.
 *
 * Order of work, so bad input stores nothing: check who may upload and the quota, run the
 * pipeline's fast checks in memory, write the original, then insert the row in a transaction
 * that locks the owner's user row and checks the quota again (two uploads at once cannot both
 * take the last megabytes). If the insert fails, the original just written is removed. The
 * variants are made by images/photo-jobs.ts, off the request path for guide photos.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import {
	Build,
	GalleryPhoto,
	Guide,
	GuideRevision,
	Part,
	Photo,
	User,
	sequelize
} from '$lib/server/db';
import type { StoredVariant } from '$lib/server/db';
import { checkUpload, PhotoRejected, plannedVariants } from '$lib/server/images/pipeline';
import {
	claimForCaller,
	photoJobSettingsFromEnv,
	processWhileWaiting
} from '$lib/server/images/photo-jobs';
import { pokePhotoWorker } from '$lib/server/images/photo-worker-inline';
import {
	newKeyPrefix,
	newOriginalKey,
	removeFiles,
	removePrefix,
	variantKey
} from '$lib/server/images/store-photo';
import { storage } from '$lib/server/storage';
import { photoStatusView, photoView } from './photo-views';
import type { PhotoStatusView, PhotoView } from './photo-views';

/** Stored bytes per account over all its photos: common practice, no published source. */
export const QUOTA_BYTES = 250 * 1024 * 1024;
/** Photos per guide, part and build (failed ones not counted). */
export const MAX_PHOTOS = { guide: 60, part: 6, build: 12 } as const;

export type PhotoTarget =
	{ kind: 'guide'; slug: string } | { kind: 'part'; slug: string } | { kind: 'build'; id: number };

export interface Actor {
	id: string;
	role: string;
}

export type UploadOutcome =
	| { kind: 'ok'; photo: PhotoView }
	| { kind: 'accepted'; status: PhotoStatusView }
	| { kind: 'not_found' }
	| { kind: 'conflict'; message: string }
	| { kind: 'rejected'; status: 413 | 415 | 422 | 503; message: string }
	| { kind: 'quota'; message: string };

export type DeleteOutcome =
	{ kind: 'ok' } | { kind: 'not_found' } | { kind: 'conflict'; message: string };

type Owner = { column: 'guideId' | 'partId' | 'buildId'; id: number };

/** The item behind a target if `actor` may add photos to it; a reason when they may not yet. */
async function resolveTarget(
	actor: Actor,
	target: PhotoTarget,
	transaction?: Transaction
): Promise<Owner | { refused: string } | null> {
	if (target.kind === 'guide') {
		// Only the guide's own author, whatever their role: another author's guide is not found.
		const guide = await Guide.findOne({
			where: { slug: target.slug, authorId: actor.id },
			transaction
		});
		if (!guide) return null;
		if (guide.state === 'archived' || guide.state === 'declined')
			return { refused: 'This guide is closed to editing, so it takes no new photos.' };
		return { column: 'guideId', id: guide.id };
	}
	if (target.kind === 'part') {
		if (actor.role !== 'editor' && actor.role !== 'admin') return null;
		const part = await Part.findOne({ where: { slug: target.slug }, transaction });
		return part ? { column: 'partId', id: part.id } : null;
	}
	const build = await Build.findOne({ where: { id: target.id, ownerId: actor.id }, transaction });
	if (!build) return null;
	if (build.visibility !== 'public')
		return {
			refused: 'Photos of a finished build are shown to everyone: make the build public first.'
		};
	if (build.hiddenAt)
		return { refused: 'This build is hidden by an editor, so it takes no new photos.' };
	return { column: 'buildId', id: build.id };
}

/** Bytes an account's photos take now. */
export async function usedBytes(userId: string, transaction?: Transaction): Promise<number> {
	const sum = await Photo.sum('bytes', { where: { ownerId: userId }, transaction });
	return Number(sum ?? 0);
}

const MB = 1024 * 1024;
function quotaMessage(used: number): string {
	return `Your photo storage is full: ${Math.ceil(used / MB)} MB of ${QUOTA_BYTES / MB} MB used. Delete photos you no longer need first.`;
}

/**
 * Uploads one photo: the request's fast checks (pipeline.ts checkUpload: size, magic bytes,
 * header and pixel limit, a decode at reduced size for a truncated file), then the original
 * under a key /media never serves and the row in `processing`, counted against the quota by
 * the original's size until the job replaces it with the variants' size.
 *
 * A guide photo is processed by the background job (images/photo-jobs.ts) and its status is
 * answered at once. `wait` (part and build photos) processes it before answering, through
 * the same job code, and answers the ready photo or the refusal, with nothing left stored.
 * `text` is the caption and alt text of a part or build photo; a guide photo gets both per
 * revision in the gallery editor instead.
 */
export async function upload(
	actor: Actor,
	target: PhotoTarget,
	file: Uint8Array,
	text: { caption: string; altText: string } = { caption: '', altText: '' }
): Promise<UploadOutcome> {
	const owner = await resolveTarget(actor, target);
	if (!owner) return { kind: 'not_found' };
	if ('refused' in owner) return { kind: 'conflict', message: owner.refused };
	const limit = MAX_PHOTOS[target.kind];
	// A failed photo holds no file and no editor lists it, so it takes no place: its row stays
	// only so the uploader's status poll can still say why it failed.
	const counted = { [owner.column]: owner.id, state: { [Op.ne]: 'failed' } };
	if ((await Photo.count({ where: counted })) >= limit)
		return { kind: 'conflict', message: `At most ${limit} photos here; delete one first.` };
	const before = await usedBytes(actor.id);
	if (before >= QUOTA_BYTES) return { kind: 'quota', message: quotaMessage(before) };

	let checked;
	try {
		checked = await checkUpload(file);
	} catch (e) {
		if (e instanceof PhotoRejected)
			return { kind: 'rejected', status: e.status, message: e.message };
		throw e;
	}
	const store = storage();
	const originalKey = newOriginalKey();
	await store.put(originalKey, file, 'application/octet-stream');
	const wait = target.kind !== 'guide';
	const settings = photoJobSettingsFromEnv();
	let created: { quota: number } | { photo: Photo; attemptId: string | null };
	try {
		created = await sequelize.transaction(async (transaction) => {
			await User.findByPk(actor.id, {
				attributes: ['id'],
				transaction,
				lock: transaction.LOCK.UPDATE
			});
			const used = await usedBytes(actor.id, transaction);
			if (used + file.byteLength > QUOTA_BYTES) return { quota: used };
			const photo = await Photo.create(
				{
					ownerId: actor.id,
					guideId: owner.column === 'guideId' ? owner.id : null,
					partId: owner.column === 'partId' ? owner.id : null,
					buildId: owner.column === 'buildId' ? owner.id : null,
					keyPrefix: newKeyPrefix(),
					width: checked.width,
					height: checked.height,
					bytes: file.byteLength,
					placeholder: '',
					variants: [],
					state: 'processing',
					variantsTotal: plannedVariants(checked.width).length,
					originalKey,
					caption: text.caption,
					altText: text.altText
				},
				{ transaction }
			);
			const attemptId = wait
				? await claimForCaller(sequelize, photo.id, settings, transaction)
				: null;
			return { photo, attemptId };
		});
	} catch (e) {
		await store.delete([originalKey]).catch(() => undefined);
		throw e;
	}
	if ('quota' in created) {
		await store.delete([originalKey]);
		return { kind: 'quota', message: quotaMessage(created.quota) };
	}
	const { photo, attemptId } = created;
	if (!attemptId) {
		pokePhotoWorker();
		return { kind: 'accepted', status: statusOf(photo, target) };
	}
	const job = { id: photo.id, keyPrefix: photo.keyPrefix, originalKey, attempts: 1, attemptId };
	const processed = await processWhileWaiting(sequelize, storage, settings, job);
	if (processed.state === 'ready') {
		await photo.reload();
		return { kind: 'ok', photo: photoView(photo) };
	}
	if (processed.state === 'failed')
		return { kind: 'rejected', status: 422, message: processed.message };
	return {
		kind: 'rejected',
		status: 503,
		message: 'The photo could not be processed just now. Try again in a minute.'
	};
}

function statusUrlOf(target: PhotoTarget, photoId: number): string {
	return target.kind === 'build'
		? `/api/v1/builds/${target.id}/photos/${photoId}`
		: `/api/v1/${target.kind}s/${target.slug}/photos/${photoId}`;
}

function statusOf(photo: Photo, target: PhotoTarget): PhotoStatusView {
	const planned = plannedVariants(photo.width).map((v) => ({
		...v,
		key: variantKey(photo.keyPrefix, v.format, v.width)
	}));
	return photoStatusView(photo, statusUrlOf(target, photo.id), planned);
}

/** Where one of the caller's guide photos stands (its author only; anyone else: null). */
export async function uploadStatus(
	actor: Actor,
	target: PhotoTarget & { kind: 'guide' },
	photoId: number
): Promise<PhotoStatusView | null> {
	const guide = await Guide.findOne({
		where: { slug: target.slug, authorId: actor.id },
		attributes: ['id']
	});
	if (!guide) return null;
	const photo = await Photo.findOne({ where: { id: photoId, guideId: guide.id } });
	return photo ? statusOf(photo, target) : null;
}

/** Revisions of a guide whose gallery the public sees or an editor is deciding on. */
async function protectedRevisionIds(guideId: number, transaction: Transaction): Promise<number[]> {
	const guide = await Guide.findByPk(guideId, { attributes: ['publishedRevisionId'], transaction });
	const pending = await GuideRevision.findAll({
		where: { guideId, submittedAt: { [Op.ne]: null }, reviewedAt: null },
		attributes: ['id'],
		transaction
	});
	return [
		...(guide?.publishedRevisionId ? [guide.publishedRevisionId] : []),
		...pending.map((r) => r.id)
	];
}

/**
 * Deletes a photo and every stored variant. A guide photo that the live revision or a
 * revision waiting for review shows is refused (409): take it out of the gallery and save;
 * once a revision without it is approved, it can be deleted.
 */
export async function remove(
	actor: Actor,
	target: PhotoTarget,
	photoId: number
): Promise<DeleteOutcome> {
	const outcome = await sequelize.transaction(async (transaction) => {
		const owner = await resolveTarget(actor, target, transaction);
		// A build that is no longer public still lets its owner delete its photos.
		const ownerOf =
			owner && 'refused' in owner ? await ownerIgnoringRefusal(actor, target, transaction) : owner;
		if (!ownerOf) return { kind: 'not_found' } as const;
		const photo = await Photo.findOne({
			where: { id: photoId, [ownerOf.column]: ownerOf.id },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!photo) return { kind: 'not_found' } as const;
		if (ownerOf.column === 'guideId') {
			const used = await GalleryPhoto.count({
				where: { photoId, revisionId: await protectedRevisionIds(ownerOf.id, transaction) },
				transaction
			});
			if (used > 0)
				return {
					kind: 'conflict',
					message:
						'This photo is in the live revision or in one waiting for review. Take it out of the gallery and save; you can delete it once a revision without it is approved.'
				} as const;
			await GalleryPhoto.destroy({ where: { photoId }, transaction });
		}
		const files = {
			variants: photo.variants as StoredVariant[],
			keyPrefix: photo.keyPrefix,
			originalKey: photo.originalKey,
			processing: photo.state !== 'ready'
		};
		await photo.destroy({ transaction });
		return { kind: 'ok', files } as const;
	});
	if (outcome.kind !== 'ok') return outcome;
	// After commit: a failed file delete leaves unreachable files, never a row without files.
	// A photo still processing (cancelled) also loses its original and whatever the job has
	// made so far; the job's own final write then finds no row and removes what it adds.
	const store = storage();
	const { files } = outcome;
	await removeFiles(store, files.variants);
	if (files.originalKey) await store.delete([files.originalKey]);
	if (files.processing) await removePrefix(store, files.keyPrefix);
	return { kind: 'ok' };
}

async function ownerIgnoringRefusal(
	actor: Actor,
	target: PhotoTarget,
	transaction: Transaction
): Promise<Owner | null> {
	if (target.kind === 'guide') {
		const guide = await Guide.findOne({
			where: { slug: target.slug, authorId: actor.id },
			transaction
		});
		return guide ? { column: 'guideId', id: guide.id } : null;
	}
	if (target.kind === 'build') {
		const build = await Build.findOne({ where: { id: target.id, ownerId: actor.id }, transaction });
		return build ? { column: 'buildId', id: build.id } : null;
	}
	return null;
}

/** The first photo of each part, by part slug: the small image in lists and guide slots. */
export async function partThumbs(slugs: string[]): Promise<Record<string, PhotoView>> {
	if (slugs.length === 0) return {};
	const parts = await Part.findAll({
		where: { slug: [...new Set(slugs)] },
		attributes: ['id', 'slug']
	});
	const slugOf = new Map(parts.map((p) => [p.id, p.slug]));
	const thumbs: Record<string, PhotoView> = {};
	const rows = await Photo.findAll({
		where: { partId: [...slugOf.keys()], hiddenAt: null, state: 'ready' },
		order: [['id', 'ASC']]
	});
	for (const row of rows) {
		const slug = slugOf.get(row.partId ?? 0);
		if (slug && !thumbs[slug]) thumbs[slug] = photoView(row);
	}
	return thumbs;
}

/** A part's photos for its pages, oldest first (hidden ones left out). */
export async function partPhotos(slug: string): Promise<PhotoView[]> {
	const part = await Part.findOne({ where: { slug }, attributes: ['id'] });
	if (!part) return [];
	const rows = await Photo.findAll({
		where: { partId: part.id, hiddenAt: null, state: 'ready' },
		order: [['id', 'ASC']]
	});
	return rows.map((r) => photoView(r));
}

/** A finished build's photos; hidden ones are left out unless `includeHidden` (editors). */
export async function buildPhotos(
	buildId: number,
	includeHidden = false
): Promise<(PhotoView & { hidden: boolean })[]> {
	const rows = await Photo.findAll({
		where: { buildId, state: 'ready', ...(includeHidden ? {} : { hiddenAt: null }) },
		order: [['id', 'ASC']]
	});
	return rows.map((r) => ({ ...photoView(r), hidden: r.hiddenAt !== null }));
}

/** Whether files under a key prefix may be served: its photo is processed and not hidden by an editor. */
export async function servable(keyPrefix: string): Promise<boolean> {
	const photo = await Photo.findOne({
		where: { keyPrefix },
		attributes: ['id', 'hiddenAt', 'state']
	});
	return photo !== null && photo.hiddenAt === null && photo.state === 'ready';
}
