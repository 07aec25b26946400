/*
 * What the encoders can make, and the sizes a photo's stored copies will have. The limits
 * are sharp's own answers here (sharp 0.35.6 with libwebp 1.6 and libheif 1.23): WebP takes at
 * most 16383 pixels on a side, AVIF 16384, so a copy may be at most 16383 on a side. The sizes
 * are worked by hand from the rule in domain/photo-variants.ts (round to the nearest pixel).
 */
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import {
	MAX_ENCODED_SIDE,
	oversizedCopy,
	plannedSizes,
	tallestAllowed
} from '../../src/lib/domain/photo-variants';
import { makeFiles, PhotoRejected } from '../../src/lib/server/images/pipeline';

const strip = (width: number, height: number) =>
	sharp({ create: { width, height, channels: 3, background: '#3a6b35' } });

describe('the encoders in this build of sharp', () => {
	it('make WebP up to 16383 pixels on a side and refuse 16384', async () => {
		await expect(strip(1, 16383).webp().toBuffer()).resolves.toBeInstanceOf(Buffer);
		await expect(strip(1, 16384).webp().toBuffer()).rejects.toThrow(/too large for the WebP/);
	});

	it('make AVIF up to 16384 pixels on a side and refuse 16385', async () => {
		await expect(strip(1, 16384).avif({ effort: 0 }).toBuffer()).resolves.toBeInstanceOf(Buffer);
		await expect(strip(1, 16385).avif({ effort: 0 }).toBuffer()).rejects.toThrow(/too large/);
	});

	it('so a stored copy may be at most 16383 pixels on a side', () => {
		expect(MAX_ENCODED_SIDE).toBe(16383);
	});
});

describe('the stored copies of an original', () => {
	it('are made from the original up to 1600 wide, and from the 1600 copy above it', () => {
		expect(plannedSizes({ width: 1000, height: 20000 })).toEqual([
			{ width: 480, height: 9600 },
			{ width: 960, height: 19200 }
		]);
		// 2400 × 1600 → 1600 × 1067 (1066.67); 480 and 960 from 1600 × 1067: 320.1 → 320, 640.2 → 640.
		expect(plannedSizes({ width: 2400, height: 1600 })).toEqual([
			{ width: 480, height: 320 },
			{ width: 960, height: 640 },
			{ width: 1600, height: 1067 }
		]);
		expect(plannedSizes({ width: 300, height: 17000 })).toEqual([{ width: 300, height: 17000 }]);
	});

	it('are too large when one is over 16383 pixels tall, and say which', () => {
		expect(oversizedCopy({ width: 1000, height: 20000 })).toEqual({ width: 960, height: 19200 });
		expect(oversizedCopy({ width: 480, height: 16384 })).toEqual({ width: 480, height: 16384 });
		expect(oversizedCopy({ width: 480, height: 16383 })).toBeNull();
		// 1000 × 17066: the 960 copy is 16383.36 → 16383 tall; one pixel more gives 16384.32 → 16384.
		expect(oversizedCopy({ width: 1000, height: 17066 })).toBeNull();
		expect(oversizedCopy({ width: 1000, height: 17067 })).toEqual({ width: 960, height: 16384 });
		// Very wide is no trouble: 40000 × 1000 gives copies 1 to 40 pixels tall.
		expect(oversizedCopy({ width: 40000, height: 1000 })).toBeNull();
	});

	it('name the tallest original that fits its width', () => {
		expect(tallestAllowed(1000)).toBe(17066);
		expect(tallestAllowed(300)).toBe(16383);
		expect(tallestAllowed(1600)).toBe(16383);
		// 2000 wide: the 1600 copy is 0.8 of the height; 20479 × 0.8 = 16383.2 → 16383.
		expect(tallestAllowed(2000)).toBe(20479);
	});
});

describe('an encoder that refuses a copy', () => {
	it('is a refusal of the photo (422) naming the copy and the reason, not a crash', async () => {
		// Pixels that never went through the upload's checks: 300 × 17000 kept at its own width.
		const { data, info } = await strip(300, 17000).raw().toBuffer({ resolveWithObject: true });
		const refused = await makeFiles({ data, info }, 300).catch((e: unknown) => e);
		expect(refused).toBeInstanceOf(PhotoRejected);
		expect(refused).toMatchObject({ status: 422 });
		expect((refused as Error).message).toMatch(/AVIF copy 300 pixels wide could not be made/);
		expect((refused as Error).message).toMatch(/too large for the HEIF format/);
	});
});
