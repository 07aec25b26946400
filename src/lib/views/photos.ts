/*
 * Photos as pages show them: variant URLs and srcsets (services/photo-views.ts), a guide
 * revision's gallery by assembly stage (services/gallery.ts) and a build's assembly
 * checklist (services/build-checklist.ts).
 */
import type { AssemblyStage } from '$lib/domain/assembly-stages';

export interface PhotoVariantView {
	format: 'avif' | 'webp' | 'jpeg';
	width: number;
	height: number;
	url: string;
}

export interface PhotoView {
	id: number;
	width: number;
	height: number;
	placeholder: string;
	avifSrcset: string;
	webpSrcset: string;
	/** The JPEG every browser can show (img src). */
	fallbackUrl: string;
	/** The widest variant's URL (WebP), for the lightbox. */
	largestUrl: string;
	variants: PhotoVariantView[];
	caption: string;
	altText: string;
}

export interface GalleryItem {
	photoId: number;
	stage: AssemblyStage;
	caption: string;
	altText: string;
}

export interface GalleryEntry extends GalleryItem {
	photo: PhotoView;
}

export interface GalleryStageView {
	stage: AssemblyStage;
	label: string;
	cautions: string[];
	photos: PhotoView[];
}

export interface PublishedGallery {
	stages: GalleryStageView[];
	deferToManuals: string;
}

export interface GalleryChanges {
	added: GalleryEntry[];
	removed: GalleryEntry[];
	/** Same photo, another stage, caption or alt text. */
	changed: { before: GalleryEntry; after: GalleryEntry }[];
}

export interface ChecklistStageView {
	stage: AssemblyStage;
	label: string;
	cautions: string[];
	photos: PhotoView[];
	steps: string[];
	done: boolean;
}

export interface ChecklistView {
	general: string[];
	stages: ChecklistStageView[];
	progress: { done: number; total: number; percent: number };
	deferToManuals: string;
}

/**
 * Where an upload stands (POST answers it with 201, GET on `statusUrl` reports it): the
 * background job makes `progress.total` files; `photo` is there once the state is `ready`,
 * `message` once it is `failed`. `variants` are the URLs the photo will have when ready.
 */
export interface PhotoStatusView {
	id: number;
	state: 'processing' | 'ready' | 'failed';
	progress: { done: number; total: number };
	message: string | null;
	statusUrl: string;
	width: number;
	height: number;
	variants: { format: PhotoVariantView['format']; width: number; url: string }[];
	photo: PhotoView | null;
}
