/*
 * Image files for the photo tests, made here rather than shipped: a JPEG carrying EXIF GPS
 * coordinates and an orientation, a decompression bomb, a truncated JPEG and files that only
 * pretend to be photos. Colours and shapes are our own; nothing is a photograph.
 */
import { deflateSync } from 'node:zlib';
import sharp from 'sharp';

/** 51° 30′ 0″ N, 0° 7′ 0″ W: 51.5 and −0.11666… in decimal degrees (worked by hand: 30/60 = 0.5, 7/60). */
export const GPS_EXIF = {
	GPSLatitudeRef: 'N',
	GPSLatitude: '51/1 30/1 0/1',
	GPSLongitudeRef: 'W',
	GPSLongitude: '0/1 7/1 0/1'
};

/** A 1200 × 800 JPEG whose EXIF says "rotate 90° clockwise to view" (orientation 6) and carries GPS. */
export async function jpegWithGps(width = 1200, height = 800): Promise<Buffer> {
	// Drawn from plain rectangles, not SVG: the pipeline blocks the SVG loader in this process.
	const block = {
		create: {
			width: Math.round(width / 2),
			height: Math.round(height / 2),
			channels: 3 as const,
			background: '#b4532a'
		}
	};
	return sharp({ create: { width, height, channels: 3, background: '#2f4858' } })
		.composite([{ input: block, left: Math.round(width / 10), top: Math.round(height / 5) }])
		.jpeg({ quality: 85 })
		.withMetadata({ orientation: 6 })
		.withExif({ IFD0: { Make: 'Testa', Model: 'Bench cam' }, IFD3: GPS_EXIF })
		.toBuffer();
}

/** A plain PNG of the given size (a flat colour with one stripe). */
export async function plainPng(width: number, height: number): Promise<Buffer> {
	return sharp({ create: { width, height, channels: 3, background: '#0e6f6a' } })
		.png()
		.toBuffer();
}

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
	let c = n;
	for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
	return c >>> 0;
});
function crc32(bytes: Uint8Array): number {
	let c = 0xffffffff;
	for (const b of bytes) c = (CRC_TABLE[(c ^ b) & 0xff] ?? 0) ^ (c >>> 8);
	return (c ^ 0xffffffff) >>> 0;
}
function chunk(type: string, data: Buffer): Buffer {
	const length = Buffer.alloc(4);
	length.writeUInt32BE(data.length);
	const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(body));
	return Buffer.concat([length, body, crc]);
}

/**
 * A real decompression bomb: a valid 8-bit greyscale PNG of `side` × `side` pixels, all
 * black, compressed to a few hundred kilobytes (14000² = 196 million pixels; decoded it would
 * need 196 MB as greyscale and 588 MB as RGB).
 */
export function bombPng(side = 14_000): Buffer {
	const header = Buffer.alloc(13);
	header.writeUInt32BE(side, 0);
	header.writeUInt32BE(side, 4);
	header[8] = 8; // bit depth
	header[9] = 0; // greyscale
	const raw = Buffer.alloc((side + 1) * side); // each row: filter byte 0 + zeros
	const compressed = deflateSync(raw, { level: 9 });
	return Buffer.concat([
		Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
		chunk('IHDR', header),
		chunk('IDAT', compressed),
		chunk('IEND', Buffer.alloc(0))
	]);
}

/** A JPEG cut off after 60 % of its bytes (as an interrupted copy leaves it). */
export async function truncatedJpeg(): Promise<Buffer> {
	const whole = await sharp({
		create: {
			width: 800,
			height: 600,
			channels: 3,
			background: '#777777',
			noise: { type: 'gaussian', mean: 120, sigma: 30 }
		}
	})
		.jpeg({ quality: 85 })
		.toBuffer();
	return whole.subarray(0, Math.floor(whole.length * 0.6));
}

export const svgFile = () =>
	Buffer.from(
		'<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>'
	);

/** An ELF executable's header followed by junk: what a program renamed to photo.jpg starts with. */
export const elfRenamedJpg = () =>
	Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(2000, 0x90)]);

/** A GIF header that is also a line of script (a classic GIF/JavaScript polyglot). */
export const gifPolyglot = () => Buffer.from('GIF89a/*\x01\x00\x01\x00\x00\x00\x00*/=alert(1)//;');

/** The first bytes of an HEIC photo from a phone: an ftyp box with brand "heic". */
export const heicHeader = () =>
	Buffer.concat([
		Buffer.from([0, 0, 0, 0x18]),
		Buffer.from('ftypheic', 'ascii'),
		Buffer.from([0, 0, 0, 0]),
		Buffer.from('mif1heic', 'ascii'),
		Buffer.alloc(500)
	]);

export const textFile = () => Buffer.from('Just some notes about cable routing, not a picture.\n');
