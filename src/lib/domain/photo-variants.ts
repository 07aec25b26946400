/*
 * Which sizes a photo is stored in. Pure, so the rule is tested on its own.
 *
 * Widths 480, 960 and 1600 px cover a phone column, a laptop column and the lightbox on a
 * large screen at 1× (and the smaller two at 2×): common practice, no published source.
 * Never upscale: a width above the original is left out, and an original narrower than the
 * smallest width is stored at its own width only.
 */
export const VARIANT_WIDTHS = [480, 960, 1600] as const;
export const VARIANT_FORMATS = ['avif', 'webp'] as const;
export type VariantFormat = (typeof VARIANT_FORMATS)[number] | 'jpeg';

/** The JPEG fallback is one size: the largest stored width up to this. */
export const JPEG_FALLBACK_MAX_WIDTH = 960;

/** The widths to produce for an original `width` pixels wide (after orientation). */
export function variantWidths(width: number): number[] {
	if (!Number.isInteger(width) || width < 1) return [];
	const fitting = VARIANT_WIDTHS.filter((w) => w <= width);
	return fitting.length > 0 ? [...fitting] : [width];
}

/** The width the pipeline decodes to before it makes the copies: the original's, at most the widest variant. */
export function baseWidth(width: number): number {
	return Math.min(width, Math.max(...VARIANT_WIDTHS));
}

/** The JPEG fallback's width for those widths. */
export function fallbackWidth(widths: readonly number[]): number | null {
	const small = widths.filter((w) => w <= JPEG_FALLBACK_MAX_WIDTH);
	if (small.length > 0) return Math.max(...small);
	return widths.length > 0 ? Math.min(...widths) : null;
}

/** Height for a width, keeping the aspect ratio, rounded to whole pixels (at least 1). */
export function scaledHeight(original: { width: number; height: number }, width: number): number {
	return Math.max(1, Math.round((original.height * width) / original.width));
}

/** A `srcset` value from variants of one format, narrowest first. */
export function srcset(variants: readonly { url: string; width: number }[]): string {
	return [...variants]
		.sort((a, b) => a.width - b.width)
		.map((v) => `${v.url} ${v.width}w`)
		.join(', ');
}

/*
 * The most pixels on a side a stored copy may have: WebP takes at most 16383, AVIF 16384
 * (sharp's own refusals, checked in tests/unit/photo-encode-limits.spec.ts), JPEG 65500.
 */
export const MAX_ENCODED_SIDE = 16_383;

type Size = { width: number; height: number };

/**
 * The size of each stored width, as the pipeline makes them: the original is decoded to
 * baseWidth, and every copy is resized from that (heights rounded to the nearest pixel, as
 * sharp rounds them).
 */
export function plannedSizes(original: Size): Size[] {
	const base = { width: baseWidth(original.width), height: 0 };
	base.height =
		base.width === original.width ? original.height : scaledHeight(original, base.width);
	return variantWidths(original.width).map((width) => ({
		width,
		height: width === base.width ? base.height : scaledHeight(base, width)
	}));
}

/**
 * The first stored copy the encoders could not make, or null. Copies are at most 1600 wide
 * (or the original's own width under 480), so only a height can pass the limit: an image
 * much taller than it is wide.
 */
export function oversizedCopy(original: Size): Size | null {
	return plannedSizes(original).find((s) => s.height > MAX_ENCODED_SIDE) ?? null;
}

/** The tallest original of this width whose copies all fit (the tallest copy is the widest). */
export function tallestAllowed(width: number): number {
	const widest = Math.max(...variantWidths(width));
	let height = Math.floor(((MAX_ENCODED_SIDE + 0.5) * width) / widest);
	while (height > 1 && oversizedCopy({ width, height })) height -= 1;
	return height;
}
