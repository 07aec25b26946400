/*
 * The photo pipeline (docs/security.md §6): every upload is judged by its bytes, decoded
 * under limits, turned upright, stripped of all metadata and re-encoded into fresh files.
 * Nothing the uploader sent is ever stored or served as it came.
 *
 * 1. size: at most MAX_UPLOAD_BYTES, else 413;
 * 2. content: the magic bytes must say JPEG, PNG or WebP (domain/image-signature.ts), and
 *    sharp's own reading of the header must agree, else 415 (SVG, GIF, HEIC, programs…);
 * 3. pixels: width × height from the header at most MAX_INPUT_PIXELS, else 422 before any
 *    decoding (a decompression bomb costs a header read, not 2 GB of memory);
 * 3a. shape: every stored copy must be one the encoders can make (at most MAX_ENCODED_SIDE
 *    pixels on a side, domain/photo-variants.ts), else 422 naming the limit: an image far
 *    taller than it is wide would otherwise be accepted and fail minutes later in the job;
 * 3b. decode once at a fraction of the size with failOn 'warning' (checkUpload): a truncated or
 *    corrupt file is a 422 while the uploader waits. JPEG and WebP decode shrunk on load, so
 *    this reads every byte of the file for about a quarter of a full decode (125 ms against
 *    430 ms for a 24-megapixel JPEG here, median of 5). Everything after this runs in the
 *    background job (photo-jobs.ts), not in the request;
 * 4. decode once with failOn 'warning' (a truncated or corrupt file is a 422), honour the
 *    EXIF orientation, shrink to the widest variant, and keep raw pixels only: EXIF, GPS,
 *    XMP, IPTC and ICC data do not survive a trip through raw pixels;
 * 5. encode each width in AVIF and WebP, one JPEG fallback, and a tiny blurred placeholder.
 *    An encoder that refuses a copy anyway is a refusal of the photo (422 with its reason),
 *    which the job records as failed: the same file would fail the same way on every try.
 *
 * Only the JPEG, PNG and WebP loaders are unblocked in this process (sharp.block), so even a
 * file that slipped past step 2 could not reach another decoder.
 */
import sharp from 'sharp';
import type { Metadata, OutputInfo } from 'sharp';
// Relative imports: the demo seed (scripts/seed.ts, outside Vite) runs this pipeline too.
import { isAccepted, refusalFor, sniffImage } from '../../domain/image-signature.js';
import type { AcceptedImageKind } from '../../domain/image-signature.js';
import {
	baseWidth,
	fallbackWidth,
	MAX_ENCODED_SIDE,
	oversizedCopy,
	tallestAllowed,
	variantWidths
} from '../../domain/photo-variants.js';
import type { VariantFormat } from '../../domain/photo-variants.js';
import { MAX_INPUT_PIXELS, MAX_UPLOAD_BYTES, TOO_LARGE_MESSAGE } from './limits.js';

export { MAX_INPUT_PIXELS, MAX_UPLOAD_BYTES } from './limits.js';

/** One image may take this long in libvips before it is abandoned. */
const TIMEOUT_SECONDS = 30;

export class PhotoRejected extends Error {
	constructor(
		readonly status: 413 | 415 | 422 | 503,
		message: string
	) {
		super(message);
	}
}

export interface EncodedVariant {
	format: VariantFormat;
	width: number;
	height: number;
	data: Buffer;
}

export interface ProcessedPhoto {
	kind: AcceptedImageKind;
	/** The original's size after orientation. */
	width: number;
	height: number;
	/** A tiny blurred WebP as a data: URI, shown while the real image loads. */
	placeholder: string;
	variants: EncodedVariant[];
}

let locked = false;
/** Allows only the three loaders we accept, once per process; turns off sharp's cache of inputs. */
export function lockDecoders(): void {
	if (locked) return;
	sharp.block({ operation: ['VipsForeignLoad'] });
	sharp.unblock({
		operation: [
			'VipsForeignLoadJpegBuffer',
			'VipsForeignLoadPngBuffer',
			'VipsForeignLoadWebpBuffer'
		]
	});
	// Uploads never repeat: caching their decoded pixels only holds memory.
	sharp.cache(false);
	locked = true;
}

const SHARP_INPUT = { failOn: 'warning', limitInputPixels: MAX_INPUT_PIXELS } as const;

/*
 * At most two photos decode at once per process, a few more wait, and the rest are told to
 * come back (503): libvips already spreads one image over the cores, so more at once only
 * multiplies memory. Common practice, no published source.
 */
const MAX_RUNNING = 2;
const MAX_WAITING = 8;
let running = 0;
const waiting: (() => void)[] = [];

async function withSlot<T>(work: () => Promise<T>): Promise<T> {
	if (running >= MAX_RUNNING) {
		if (waiting.length >= MAX_WAITING)
			throw new PhotoRejected(
				503,
				'Many photos are being processed right now; try again in a minute.'
			);
		await new Promise<void>((resolve) => waiting.push(resolve));
	}
	running += 1;
	try {
		return await work();
	} finally {
		running -= 1;
		waiting.shift()?.();
	}
}

/** Checks size and content without decoding pixels: the fast refusals (413, 415, 422). */
export async function inspect(
	input: Uint8Array
): Promise<{ kind: AcceptedImageKind; width: number; height: number }> {
	if (input.byteLength > MAX_UPLOAD_BYTES) throw new PhotoRejected(413, TOO_LARGE_MESSAGE);
	if (input.byteLength === 0) throw new PhotoRejected(415, 'The file is empty.');
	const kind = sniffImage(input);
	if (!isAccepted(kind)) throw new PhotoRejected(415, refusalFor(kind));
	lockDecoders();
	let meta: Metadata;
	try {
		// The header only: no pixel limit here, so the size can be judged and named below.
		meta = await sharp(input, { failOn: 'warning', limitInputPixels: false }).metadata();
	} catch {
		throw new PhotoRejected(422, 'The image could not be read: the file is damaged or incomplete.');
	}
	// The header must agree with the magic bytes: a file cannot be one thing to us and another to libvips.
	if (meta.format !== kind) throw new PhotoRejected(415, refusalFor('unknown'));
	const width = meta.autoOrient?.width ?? meta.width ?? 0;
	const height = meta.autoOrient?.height ?? meta.height ?? 0;
	if (width < 1 || height < 1)
		throw new PhotoRejected(422, 'The image could not be read: it has no size.');
	if (width * height > MAX_INPUT_PIXELS) {
		const megapixels = Math.round((width * height) / 1_000_000);
		throw new PhotoRejected(
			422,
			`The image is ${width} × ${height} pixels (${megapixels} megapixels); at most ${MAX_INPUT_PIXELS / 1_000_000} megapixels are accepted.`
		);
	}
	const oversized = oversizedCopy({ width, height });
	if (oversized)
		throw new PhotoRejected(
			422,
			`The image is ${width} × ${height} pixels, too tall for its width: its copy ${oversized.width} pixels wide would be ${oversized.height} pixels tall, and a stored photo can be at most ${MAX_ENCODED_SIDE} pixels on a side. Crop it to at most ${tallestAllowed(width)} pixels tall.`
		);
	return { kind, width, height };
}

/** The files a photo `width` pixels wide (after orientation) will have, in the order they are made. */
export function plannedVariants(width: number): { format: VariantFormat; width: number }[] {
	const widths = variantWidths(width);
	const fallback = fallbackWidth(widths);
	return widths.flatMap((w) => [
		{ format: 'avif' as const, width: w },
		{ format: 'webp' as const, width: w },
		...(w === fallback ? [{ format: 'jpeg' as const, width: w }] : [])
	]);
}

/**
 * The checks the upload request makes before it keeps anything: inspect(), then a decode at
 * a fraction of the size with failOn, so a truncated or corrupt file is refused (422) now
 * rather than failing later in the background.
 */
export async function checkUpload(
	input: Uint8Array
): Promise<{ kind: AcceptedImageKind; width: number; height: number }> {
	const header = await inspect(input);
	await withSlot(async () => {
		try {
			await sharp(input, SHARP_INPUT)
				.timeout({ seconds: TIMEOUT_SECONDS })
				.resize(64, 64, { fit: 'inside' })
				.raw()
				.toBuffer();
		} catch {
			throw new PhotoRejected(
				422,
				'The image could not be decoded: the file is damaged, incomplete or not a valid image.'
			);
		}
	});
	return header;
}

/** Called after each file is encoded: `done` of `total`; may throw to stop the work. */
export type VariantProgress = (done: number, total: number) => Promise<void> | void;

/** The whole pipeline; throws PhotoRejected for anything it refuses. */
export async function processPhoto(
	input: Uint8Array,
	onVariant: VariantProgress = () => undefined
): Promise<ProcessedPhoto> {
	const { kind, width, height } = await inspect(input);
	return withSlot(async () => {
		let base: RawImage;
		try {
			base = await sharp(input, SHARP_INPUT)
				.timeout({ seconds: TIMEOUT_SECONDS })
				.autoOrient()
				.resize({ width: baseWidth(width), withoutEnlargement: true })
				.toColourspace('srgb')
				.raw()
				.toBuffer({ resolveWithObject: true });
		} catch {
			throw new PhotoRejected(
				422,
				'The image could not be decoded: the file is damaged, incomplete or not a valid image.'
			);
		}
		return { kind, width, height, ...(await makeFiles(base, width, onVariant)) };
	});
}

type RawImage = { data: Buffer; info: OutputInfo };

const FORMAT_NAMES = { avif: 'AVIF', webp: 'WebP', jpeg: 'JPEG' } as const;

/** An encoder's refusal of one copy, as a refusal of the photo with sharp's reason. */
async function encoded(
	format: VariantFormat,
	width: number,
	make: () => Promise<RawImage>
): Promise<RawImage> {
	try {
		return await make();
	} catch (e) {
		const reason = e instanceof Error ? e.message.split('\n')[0] : String(e);
		throw new PhotoRejected(
			422,
			`The ${FORMAT_NAMES[format]} copy ${width} pixels wide could not be made (${reason}). Upload a smaller copy.`
		);
	}
}

/**
 * Encodes every stored copy and the placeholder from the decoded pixels (`base`, already at
 * baseWidth) of an original `width` pixels wide (after orientation).
 */
export async function makeFiles(
	base: RawImage,
	width: number,
	onVariant: VariantProgress = () => undefined
): Promise<{ placeholder: string; variants: EncodedVariant[] }> {
	const raw = {
		raw: {
			width: base.info.width,
			height: base.info.height,
			channels: base.info.channels as 1 | 2 | 3 | 4
		}
	};
	const from = (w: number) => {
		const pipeline = sharp(base.data, raw).timeout({ seconds: TIMEOUT_SECONDS });
		return w === base.info.width ? pipeline : pipeline.resize({ width: w });
	};
	const widths = variantWidths(width);
	const fallback = fallbackWidth(widths);
	const total = plannedVariants(width).length;
	const variants: EncodedVariant[] = [];
	const add = async (format: VariantFormat, w: number, make: () => Promise<RawImage>) => {
		const out = await encoded(format, w, make);
		variants.push({ format, width: out.info.width, height: out.info.height, data: out.data });
		await onVariant(variants.length, total);
	};
	for (const w of widths) {
		await add('avif', w, () =>
			from(w).avif({ quality: 50, effort: 2 }).toBuffer({ resolveWithObject: true })
		);
		await add('webp', w, () =>
			from(w).webp({ quality: 78, effort: 4 }).toBuffer({ resolveWithObject: true })
		);
		if (w === fallback)
			await add('jpeg', w, () =>
				from(w)
					.flatten({ background: '#ffffff' })
					.jpeg({ quality: 80, mozjpeg: true })
					.toBuffer({ resolveWithObject: true })
			);
	}
	// Inside 16 × 16 whatever the shape: a narrow strip widened to 16 could pass WebP's limit.
	const tiny = await encoded('webp', 16, () =>
		sharp(base.data, raw)
			.resize(16, 16, { fit: 'inside' })
			.blur(1)
			.webp({ quality: 40 })
			.toBuffer({ resolveWithObject: true })
	);
	return {
		placeholder: `data:image/webp;base64,${tiny.data.toString('base64')}`,
		variants
	};
}
