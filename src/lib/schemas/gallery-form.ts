import { ASSEMBLY_STAGES } from '$lib/domain/assembly-stages';
import type { GalleryItemInput } from './photos';

/*
 * The guide editor's gallery as the form holds it (strings as typed) and its conversions,
 * beside guide-editor-form.ts. Field names are dotted paths (`gallery.2.altText`) so the
 * same form works without JavaScript; `galleryShown` marks that the form carried a gallery
 * at all, so an empty gallery means "no photos" rather than "not sent".
 *
 * The guide page shows the photos grouped by stage in assembly order (services/gallery.ts
 * byStage), so the editor shows the same groups (galleryGroups) and a photo moves only among
 * the photos of its own stage (stepWithinStage): the order the author sees is the order
 * readers get. The saved order of photos of different stages does not matter to anyone.
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

/**
 * Moves photo `index` one place earlier (-1) or later (1) among the photos of its own stage,
 * over any photos of other stages between them; unchanged when it is already first or last.
 */
export function stepWithinStage(
	items: EditorGalleryItem[],
	index: number,
	by: -1 | 1
): EditorGalleryItem[] {
	const stage = items[index]?.stage;
	if (stage === undefined) return items;
	for (let j = index + by; j >= 0 && j < items.length; j += by)
		if (items[j]?.stage === stage) return moveGalleryItem(items, index, j);
	return items;
}

export interface GalleryGroup {
	/** An assembly stage's key, or '' for photos without a stage yet. */
	stage: string;
	label: string;
	/** The photos of this group in gallery order, with their index in the whole gallery. */
	entries: { item: EditorGalleryItem; index: number }[];
}

/** Photos without a (known) stage first, then each stage with photos, in assembly order. */
export function galleryGroups(items: readonly EditorGalleryItem[]): GalleryGroup[] {
	const known = new Set<string>(ASSEMBLY_STAGES.map((s) => s.key));
	const stages = [{ key: '', label: 'Not filed under a stage yet' }, ...ASSEMBLY_STAGES];
	return stages.flatMap(({ key, label }) => {
		const entries = items
			.map((item, index) => ({ item, index }))
			.filter(({ item }) => (known.has(item.stage) ? item.stage : '') === key);
		return entries.length > 0 ? [{ stage: key, label, entries }] : [];
	});
}

/**
 * An uploaded photo joins the gallery before any photo picked after it (`picked`: item key →
 * the order its file was picked in), so uploads finishing out of order keep the picked order.
 */
export function insertPicked(
	items: EditorGalleryItem[],
	added: EditorGalleryItem,
	picked: ReadonlyMap<string, number>
): EditorGalleryItem[] {
	const mine = picked.get(added.key);
	const before =
		mine === undefined ? -1 : items.findIndex((g) => (picked.get(g.key) ?? -Infinity) > mine);
	return before === -1 ? [...items, added] : items.toSpliced(before, 0, added);
}

/** `photoUp:2`, `photoDown:0`, `removePhoto:1` (the no-JS buttons); null for any other op. */
export function applyGalleryOp(items: EditorGalleryItem[], op: string): EditorGalleryItem[] | null {
	const [name, a = '-1'] = op.split(':');
	const i = Number(a);
	switch (name) {
		case 'photoUp':
			return stepWithinStage(items, i, -1);
		case 'photoDown':
			return stepWithinStage(items, i, 1);
		case 'removePhoto':
			return items.filter((_, k) => k !== i);
		default:
			return null;
	}
}
