/*
 * Photo inputs: the text that goes with a part or build photo (multipart fields beside
 * `file`), a guide gallery as the editor and PUT …/draft send it, and a checklist tick.
 * One schema per operation, shared by its form and its API.
 */
import { z } from 'zod';
import { ASSEMBLY_STAGE_KEYS } from '$lib/domain/assembly-stages';

export const CAPTION_MAX_CHARS = 300;
export const ALT_TEXT_MAX_CHARS = 300;
/** Photos in one revision's gallery (services/photos.ts MAX_PHOTOS.guide). */
export const GALLERY_MAX_PHOTOS = 60;

const caption = z
	.string()
	.trim()
	.max(CAPTION_MAX_CHARS, `At most ${CAPTION_MAX_CHARS} characters.`)
	.default('');
const altText = z
	.string({ message: 'Describe the photo for people who cannot see it.' })
	.trim()
	.min(1, 'Describe the photo for people who cannot see it.')
	.max(ALT_TEXT_MAX_CHARS, `At most ${ALT_TEXT_MAX_CHARS} characters.`);

/** Caption and alt text sent with a part or build photo. */
export const photoTextInput = z.strictObject({ caption, altText });
export type PhotoTextInput = z.infer<typeof photoTextInput>;

const stage = z.enum(ASSEMBLY_STAGE_KEYS, { message: 'Choose the assembly stage.' });

export const galleryItemInput = z.strictObject({
	photoId: z.number({ message: 'No such photo.' }).int().positive('No such photo.'),
	stage,
	caption,
	altText
});
export type GalleryItemInput = z.infer<typeof galleryItemInput>;

/** The whole gallery in display order; a photo at most once. */
export const galleryInput = z
	.array(galleryItemInput)
	.max(GALLERY_MAX_PHOTOS, `At most ${GALLERY_MAX_PHOTOS} photos.`)
	.superRefine((items, ctx) => {
		const seen = new Set<number>();
		items.forEach((item, i) => {
			if (seen.has(item.photoId))
				ctx.addIssue({
					code: 'custom',
					path: [i, 'photoId'],
					message: 'This photo is already in the gallery.'
				});
			seen.add(item.photoId);
		});
	});

/** Ticks or unticks one stage of a build's assembly checklist. */
export const stageTickInput = z.strictObject({
	stage,
	done: z.boolean({ message: 'Say whether the stage is done.' })
});
export type StageTickInput = z.infer<typeof stageTickInput>;
