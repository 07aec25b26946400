import { describe, expect, it } from 'vitest';
import {
	applyGalleryOp,
	galleryGroups,
	insertPicked,
	newGalleryItem,
	stepWithinStage
} from '../../src/lib/schemas/gallery-form';
import type { EditorGalleryItem } from '../../src/lib/schemas/gallery-form';

/*
 * The guide editor's gallery as readers will see it: the guide page groups photos by stage
 * (services/gallery.ts byStage), so the editor groups them the same way and moves a photo
 * only among the photos of its stage; uploads join in the order they were picked.
 */

const item = (photoId: number, stage: string): EditorGalleryItem => ({
	...newGalleryItem(photoId),
	stage
});
const ids = (items: EditorGalleryItem[]) => items.map((g) => Number(g.photoId));

// Cooler photos 1 and 3 with a power-supply photo between them in the saved order.
const mixed = [item(1, 'cooler'), item(2, 'psu-cabling'), item(3, 'cooler')];

describe('moving a photo earlier or later', () => {
	it('moves past the previous photo of its own stage, over photos of other stages', () => {
		expect(ids(applyGalleryOp(mixed, 'photoUp:2') ?? [])).toEqual([3, 1, 2]);
		expect(ids(stepWithinStage(mixed, 2, -1))).toEqual([3, 1, 2]);
	});

	it('moves past the next photo of its own stage', () => {
		expect(ids(applyGalleryOp(mixed, 'photoDown:0') ?? [])).toEqual([2, 3, 1]);
	});

	it('stays put when it is already first or last of its stage', () => {
		expect(ids(applyGalleryOp(mixed, 'photoUp:0') ?? [])).toEqual([1, 2, 3]);
		expect(ids(applyGalleryOp(mixed, 'photoDown:1') ?? [])).toEqual([1, 2, 3]);
		expect(ids(applyGalleryOp(mixed, 'photoDown:2') ?? [])).toEqual([1, 2, 3]);
	});

	it('still takes a photo out by its index', () => {
		expect(ids(applyGalleryOp(mixed, 'removePhoto:1') ?? [])).toEqual([1, 3]);
	});
});

describe('groups as the guide page shows them', () => {
	it('lists photos without a stage first, then the stages in assembly order, each in gallery order', () => {
		const groups = galleryGroups([...mixed, item(4, ''), item(5, 'prepare-case')]);
		expect(groups.map((g) => g.stage)).toEqual(['', 'prepare-case', 'cooler', 'psu-cabling']);
		expect(groups.map((g) => g.entries.map((e) => e.index))).toEqual([[3], [4], [0, 2], [1]]);
		expect(groups[2]?.label).toBe('CPU cooler');
	});

	it('leaves out stages without photos', () => {
		expect(galleryGroups([]).length).toBe(0);
	});
});

describe('uploads join in the order they were picked', () => {
	it('puts a photo before the photos picked after it, whatever finished first', () => {
		const picked = new Map([
			['g11', 1],
			['g12', 2],
			['g13', 3]
		]);
		// 12 and 13 finished before 11; a photo already in the gallery (7) stays first.
		let gallery = [item(7, 'cooler')];
		gallery = insertPicked(gallery, newGalleryItem(12), picked);
		gallery = insertPicked(gallery, newGalleryItem(13), picked);
		gallery = insertPicked(gallery, newGalleryItem(11), picked);
		expect(ids(gallery)).toEqual([7, 11, 12, 13]);
	});

	it('adds a photo it knows no pick order for at the end', () => {
		expect(ids(insertPicked([item(7, '')], newGalleryItem(8), new Map()))).toEqual([7, 8]);
	});
});
