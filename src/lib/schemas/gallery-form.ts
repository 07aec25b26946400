import type { GalleryItemInput } from './photos';

/*
 * The guide editor's gallery as the form holds it (strings as typed) and its conversions,
 * beside guide-editor-form.ts. Field names are dotted paths (`gallery.2.altText`) so the
 * same form works without JavaScript; `galleryShown` marks that the form carried a gallery
 * at all, so an empty gallery means "no photos" rather than "not sent".
 */
export interface EditorGalleryItem {
	key: string;
	photoId: string;
	stage: string;
	caption: string;
	altText: string;
}

export const GALLERY_SHOWN_FIELD = 'galleryShown';

export function galleryFromDraft(
	items: { photoId: number; stage: string; caption: string; altText: string }[] | undefined
): EditorGalleryItem[] {
	return (items ?? []).map((g) => ({
		key: `g${g.photoId}`,
		photoId: String(g.photoId),
		stage: g.stage,
		caption: g.caption,
		altText: g.altText
	}));
}

export function newGalleryItem(photoId: number): EditorGalleryItem {
	return { key: `g${photoId}`, photoId: String(photoId), stage: '', caption: '', altText: '' };
}

/** What galleryInput parses: ids as numbers (NaN when not one, which zod reports). */
export function galleryToInput(
	items: EditorGalleryItem[]
): Record<keyof GalleryItemInput, unknown>[] {
	return items.map((g) => ({
		photoId: g.photoId.trim() === '' ? NaN : Number(g.photoId),
		stage: g.stage,
		caption: g.caption,
		altText: g.altText
	}));
}

/** Moves one photo (drag and drop, or the keyboard). */
export function moveGalleryItem(
	items: EditorGalleryItem[],
	from: number,
	to: number
): EditorGalleryItem[] {
	if (from === to || from < 0 || to < 0 || from >= items.length || to >= items.length) return items;
	const copy = [...items];
	const [moved] = copy.splice(from, 1);
	if (moved) copy.splice(to, 0, moved);
	return copy;
}

/** `photoUp:2`, `photoDown:0`, `removePhoto:1` (the no-JS buttons); null for any other op. */
export function applyGalleryOp(items: EditorGalleryItem[], op: string): EditorGalleryItem[] | null {
	const [name, a = '-1'] = op.split(':');
	const i = Number(a);
	switch (name) {
		case 'photoUp':
			return moveGalleryItem(items, i, i - 1);
		case 'photoDown':
			return moveGalleryItem(items, i, i + 1);
		case 'removePhoto':
			return items.filter((_, k) => k !== i);
		default:
			return null;
	}
}
