/*
 * The plain shape of a photo for pages and the API: URLs under /media for each variant,
 * srcset strings per format, the JPEG fallback and the placeholder. Model in, plain out.
 */
import { srcset } from '$lib/domain/photo-variants';
import type { Photo, StoredVariant } from '$lib/server/db';
import type { PhotoStatusView, PhotoVariantView, PhotoView } from '$lib/views';

export type { PhotoStatusView, PhotoVariantView, PhotoView };

export const mediaUrl = (key: string) => `/media/${key}`;

export function photoView(photo: Photo, text?: { caption: string; altText: string }): PhotoView {
	const variants: PhotoVariantView[] = (photo.variants as StoredVariant[]).map((v) => ({
		format: v.format,
		width: v.width,
		height: v.height,
		url: mediaUrl(v.key)
	}));
	const of = (format: PhotoVariantView['format']) => variants.filter((v) => v.format === format);
	const webp = of('webp').sort((a, b) => b.width - a.width);
	const jpeg = of('jpeg')[0] ?? webp[0];
	return {
		id: photo.id,
		width: photo.width,
		height: photo.height,
		placeholder: photo.placeholder,
		avifSrcset: srcset(of('avif')),
		webpSrcset: srcset(webp),
		fallbackUrl: jpeg?.url ?? '',
		largestUrl: webp[0]?.url ?? jpeg?.url ?? '',
		variants,
		caption: text?.caption ?? photo.caption,
		altText: text?.altText ?? photo.altText
	};
}

/**
 * An upload's state for its uploader. `planned` are the files the job will make (pipeline.ts
 * plannedVariants), whose keys are fixed by the prefix, so their URLs are known at once.
 */
export function photoStatusView(
	photo: Photo,
	statusUrl: string,
	planned: { format: PhotoVariantView['format']; width: number; key: string }[]
): PhotoStatusView {
	return {
		id: photo.id,
		state: photo.state,
		progress: { done: photo.variantsDone, total: photo.variantsTotal },
		message: photo.state === 'failed' ? photo.failure : null,
		statusUrl,
		width: photo.width,
		height: photo.height,
		variants:
			photo.state === 'failed'
				? []
				: planned.map((v) => ({ format: v.format, width: v.width, url: mediaUrl(v.key) })),
		photo: photo.state === 'ready' ? photoView(photo) : null
	};
}
