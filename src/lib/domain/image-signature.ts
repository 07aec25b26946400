/*
 * What an uploaded file is, judged by its first bytes (its "magic number"), never by its
 * name or the type the browser claims (docs/security.md §6). Pure: bytes in, a kind out.
 *
 * Signatures (from the formats' own specifications, as every sniffer checks them):
 * - JPEG: FF D8 FF (SOI marker followed by the next marker's FF; ITU-T T.81 B.1.1.3)
 * - PNG: 89 50 4E 47 0D 0A 1A 0A (PNG specification §5.2)
 * - WebP: "RIFF", 4 length bytes, "WEBP" (RFC 9649 §2.5)
 * - HEIF/HEIC/AVIF: an ISO BMFF "ftyp" box at offset 4 with a HEIF brand (ISO/IEC 23008-12)
 * - GIF: "GIF87a" / "GIF89a"; SVG and other XML: text starting with "<" after optional BOM
 *   and white space; executables: "MZ" (Windows PE), 7F "ELF", Mach-O magic numbers.
 */

/** The kinds we accept for decoding. */
export const ACCEPTED_IMAGE_KINDS = ['jpeg', 'png', 'webp'] as const;
export type AcceptedImageKind = (typeof ACCEPTED_IMAGE_KINDS)[number];

export type ImageKind =
	AcceptedImageKind | 'heic' | 'avif' | 'gif' | 'svg' | 'executable' | 'unknown';

const startsWith = (bytes: Uint8Array, signature: readonly number[], offset = 0) =>
	bytes.length >= offset + signature.length && signature.every((b, i) => bytes[offset + i] === b);

const ascii = (bytes: Uint8Array, from: number, to: number) =>
	String.fromCharCode(...bytes.subarray(from, Math.min(to, bytes.length)));

const HEIC_BRANDS = new Set(['heic', 'heix', 'hevc', 'hevx', 'heim', 'heis', 'mif1', 'msf1']);
const AVIF_BRANDS = new Set(['avif', 'avis']);

export function sniffImage(bytes: Uint8Array): ImageKind {
	if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'jpeg';
	if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'png';
	if (ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 12) === 'WEBP') return 'webp';
	if (ascii(bytes, 4, 8) === 'ftyp') {
		const major = ascii(bytes, 8, 12);
		if (AVIF_BRANDS.has(major)) return 'avif';
		if (HEIC_BRANDS.has(major)) return 'heic';
	}
	if (ascii(bytes, 0, 6) === 'GIF87a' || ascii(bytes, 0, 6) === 'GIF89a') return 'gif';
	if (
		startsWith(bytes, [0x4d, 0x5a]) ||
		startsWith(bytes, [0x7f, 0x45, 0x4c, 0x46]) ||
		startsWith(bytes, [0xcf, 0xfa, 0xed, 0xfe]) ||
		startsWith(bytes, [0xfe, 0xed, 0xfa, 0xcf]) ||
		startsWith(bytes, [0xca, 0xfe, 0xba, 0xbe])
	)
		return 'executable';
	const text = ascii(bytes, 0, 512)
		.replace(/^\uFEFF|^\xEF\xBB\xBF/, '')
		.trimStart()
		.toLowerCase();
	if (text.startsWith('<svg') || (text.startsWith('<?xml') && text.includes('<svg'))) return 'svg';
	if (text.startsWith('<')) return 'svg';
	return 'unknown';
}

export function isAccepted(kind: ImageKind): kind is AcceptedImageKind {
	return (ACCEPTED_IMAGE_KINDS as readonly string[]).includes(kind);
}

/** Why a kind is refused, in words an author understands (the 415 message). */
export function refusalFor(kind: ImageKind): string {
	switch (kind) {
		case 'heic':
			return 'HEIC photos cannot be read here: the image library on this server has no HEVC decoder. Export the photo as JPEG (most phones can save "Most compatible") and upload that.';
		case 'avif':
			return 'AVIF uploads are not accepted. Upload a JPEG, PNG or WebP photo.';
		case 'svg':
			return 'SVG and other markup files are not accepted, because they can carry scripts. Upload a JPEG, PNG or WebP photo.';
		case 'gif':
			return 'GIF files are not accepted. Upload a JPEG, PNG or WebP photo.';
		case 'executable':
			return 'That file is a program, not a photo. Upload a JPEG, PNG or WebP photo.';
		default:
			return 'That file is not a JPEG, PNG or WebP image (judged by its content, not its name).';
	}
}
