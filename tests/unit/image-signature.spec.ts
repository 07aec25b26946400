import { describe, expect, it } from 'vitest';
import { isAccepted, refusalFor, sniffImage } from '../../src/lib/domain/image-signature';
import { fallbackWidth, srcset, variantWidths } from '../../src/lib/domain/photo-variants';

/*
 * Magic bytes from the formats' specifications: JPEG SOI FF D8 then a marker's FF (ITU-T
 * T.81 B.1.1.3), PNG's 8-byte signature (PNG spec §5.2), WebP "RIFF" size "WEBP" (RFC 9649
 * §2.5), ISO BMFF ftyp with HEIF brands (ISO/IEC 23008-12), ELF 7F "ELF", PE "MZ".
 */
const bytes = (...parts: (number[] | string)[]) =>
	new Uint8Array(parts.flatMap((p) => (typeof p === 'string' ? [...Buffer.from(p, 'latin1')] : p)));

describe('sniffImage: judged by content, not by name', () => {
	it('knows the three accepted formats by their first bytes', () => {
		expect(sniffImage(bytes([0xff, 0xd8, 0xff, 0xe0, 0, 0x10]))).toBe('jpeg');
		expect(sniffImage(bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe('png');
		expect(sniffImage(bytes('RIFF', [0x24, 0, 0, 0], 'WEBPVP8 '))).toBe('webp');
	});

	it('tells HEIC, AVIF, GIF, SVG and programs apart, and refuses them all', () => {
		const cases: [Uint8Array, string][] = [
			[bytes([0, 0, 0, 0x18], 'ftypheic', [0, 0, 0, 0]), 'heic'],
			[bytes([0, 0, 0, 0x18], 'ftypmif1'), 'heic'],
			[bytes([0, 0, 0, 0x1c], 'ftypavif'), 'avif'],
			[bytes('GIF89a', [1, 0]), 'gif'],
			[bytes([0xef, 0xbb, 0xbf], '  <svg xmlns="http://www.w3.org/2000/svg">'), 'svg'],
			[bytes('<?xml version="1.0"?>\n<svg>'), 'svg'],
			[bytes([0x7f], 'ELF', [2, 1, 1]), 'executable'],
			[bytes('MZ', [0x90, 0]), 'executable'],
			[bytes('hello, not an image'), 'unknown'],
			[bytes([]), 'unknown']
		];
		for (const [input, kind] of cases) {
			expect(sniffImage(input)).toBe(kind);
			expect(isAccepted(sniffImage(input))).toBe(false);
		}
	});

	it('does not take a truncated signature for the real thing', () => {
		expect(sniffImage(bytes([0xff, 0xd8]))).toBe('unknown');
		expect(sniffImage(bytes([0x89, 0x50, 0x4e, 0x47]))).toBe('unknown');
		expect(sniffImage(bytes('RIFF', [0, 0, 0, 0], 'WAVE'))).toBe('unknown');
	});

	it('says why HEIC is refused and what to do instead', () => {
		expect(refusalFor('heic')).toMatch(/HEVC/);
		expect(refusalFor('heic')).toMatch(/JPEG/);
		expect(refusalFor('svg')).toMatch(/scripts/);
	});
});

describe('variant widths: 480, 960, 1600, never upscaled (common practice, no published source)', () => {
	it('keeps the widths up to the original', () => {
		expect(variantWidths(4000)).toEqual([480, 960, 1600]);
		expect(variantWidths(1600)).toEqual([480, 960, 1600]);
		expect(variantWidths(1599)).toEqual([480, 960]);
		expect(variantWidths(960)).toEqual([480, 960]);
		expect(variantWidths(700)).toEqual([480]);
	});

	it('stores a narrow original at its own width only', () => {
		expect(variantWidths(300)).toEqual([300]);
		expect(variantWidths(0)).toEqual([]);
	});

	it('picks the JPEG fallback as the widest up to 960', () => {
		expect(fallbackWidth([480, 960, 1600])).toBe(960);
		expect(fallbackWidth([480])).toBe(480);
		expect(fallbackWidth([300])).toBe(300);
	});

	it('writes srcset narrowest first', () => {
		expect(
			srcset([
				{ url: '/m/b.webp', width: 960 },
				{ url: '/m/a.webp', width: 480 }
			])
		).toBe('/m/a.webp 480w, /m/b.webp 960w');
	});
});
