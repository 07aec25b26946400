/*
 * Demo photos: two demo guides get a small gallery (cooler, power supply and cabling, cable
 * management) in their published revision, and three catalog parts get a picture. The
 * pictures are our own abstract drawings (demo-data/drawings.ts), rasterised with sharp and
 * sent through the same pipeline and photo store as uploads. Idempotent: a guide whose
 * published revision already has a gallery, or a part that already has a photo, is skipped.
 */
import sharp from 'sharp';
import { processPhoto } from '../../images/pipeline.js';
import { removeFiles, storeFiles } from '../../images/store-photo.js';
import { storage } from '../../storage/index.js';
import type { Seeder } from '../umzug.js';
import { GalleryPhoto, Guide, Part, Photo } from '../models/index.js';
import type { StoredVariant } from '../models/index.js';
import { drawingSvg } from './demo-data/drawings.js';
import type { DrawingKind } from './demo-data/drawings.js';

const GALLERIES: {
	guide: string;
	photos: { kind: DrawingKind; stage: string; alt: string; caption: string }[];
}[] = [
	{
		guide: 'steady-1080p-starter',
		photos: [
			{
				kind: 'cooler',
				stage: 'cooler',
				alt: 'Drawing of the boxed cooler seated on the CPU, fan facing up',
				caption: 'The boxed cooler, screws tightened crosswise.'
			},
			{
				kind: 'psu-cabling',
				stage: 'psu-cabling',
				alt: 'Drawing of three power leads leaving the power supply in loose loops',
				caption: 'Leads connected before tidying: no connector pulled at an angle.'
			},
			{
				kind: 'cable-management',
				stage: 'cable-management',
				alt: 'Drawing of the same leads routed up the right edge and held by three ties',
				caption: 'Routed behind the tray and tied every 8 cm.'
			}
		]
	},
	{
		guide: 'balanced-1440p-am5',
		photos: [
			{
				kind: 'cooler',
				stage: 'cooler',
				alt: 'Drawing of a tower cooler with its fan blowing towards the rear',
				caption: 'Fan towards the rear exhaust.'
			},
			{
				kind: 'cable-management',
				stage: 'cable-management',
				alt: 'Drawing of two separate graphics power leads tied along the edge',
				caption: 'Two separate 8-pin leads for the graphics card.'
			}
		]
	}
];

const PART_PICTURES: { part: string; hue: string; alt: string }[] = [
	{
		part: 'solenne-cobalt-c6-8g',
		hue: '#0e6f6a',
		alt: 'Drawing of a graphics card as a plain teal block'
	},
	{
		part: 'ironvale-auric-a52-8g',
		hue: '#b4532a',
		alt: 'Drawing of a graphics card as a plain copper block'
	},
	{
		part: 'ironvale-cobalt-c7-16g',
		hue: '#5b6672',
		alt: 'Drawing of a graphics card as a plain grey block'
	}
];

/*
 * The photo pipeline locks this process's decoders to JPEG, PNG and WebP (lockDecoders), and
 * in a test process it may already have run. The drawings are our own SVG, so the SVG loader
 * is opened for the draws in flight and closed again when the last one ends.
 */
const SVG_LOADER = { operation: ['VipsForeignLoadSvgBuffer'] };
let drawsInFlight = 0;

async function draw(kind: DrawingKind, hue?: string): Promise<Buffer> {
	if (drawsInFlight++ === 0) sharp.unblock(SVG_LOADER);
	try {
		return await sharp(Buffer.from(drawingSvg(kind, hue)))
			.jpeg({ quality: 90 })
			.toBuffer();
	} finally {
		if (--drawsInFlight === 0) sharp.block(SVG_LOADER);
	}
}

export const up: Seeder = async () => {
	const store = storage();
	// Draw everything first: the pipeline blocks the SVG loader in this process once it runs.
	const galleries = [];
	for (const g of GALLERIES) {
		const guide = await Guide.findOne({ where: { slug: g.guide } });
		if (!guide?.publishedRevisionId) continue;
		if ((await GalleryPhoto.count({ where: { revisionId: guide.publishedRevisionId } })) > 0)
			continue;
		galleries.push({
			guide,
			photos: await Promise.all(g.photos.map(async (p) => ({ ...p, image: await draw(p.kind) })))
		});
	}
	const parts = [];
	for (const p of PART_PICTURES) {
		const part = await Part.findOne({ where: { slug: p.part } });
		if (!part || (await Photo.count({ where: { partId: part.id } })) > 0) continue;
		parts.push({ part, alt: p.alt, image: await draw('part', p.hue) });
	}

	const stored: StoredVariant[][] = [];
	try {
		for (const { guide, photos } of galleries) {
			for (const [i, p] of photos.entries()) {
				const processed = await processPhoto(p.image);
				const files = await storeFiles(store, processed);
				stored.push(files.variants);
				const photo = await Photo.create({
					ownerId: guide.authorId ?? null,
					guideId: guide.id,
					keyPrefix: files.keyPrefix,
					width: processed.width,
					height: processed.height,
					bytes: files.bytes,
					placeholder: processed.placeholder,
					variants: files.variants
				});
				await GalleryPhoto.create({
					revisionId: guide.publishedRevisionId ?? 0,
					photoId: photo.id,
					stage: p.stage,
					position: i + 1,
					caption: p.caption,
					altText: p.alt
				});
			}
		}
		for (const { part, alt, image } of parts) {
			const processed = await processPhoto(image);
			const files = await storeFiles(store, processed);
			stored.push(files.variants);
			await Photo.create({
				ownerId: null,
				partId: part.id,
				keyPrefix: files.keyPrefix,
				width: processed.width,
				height: processed.height,
				bytes: files.bytes,
				placeholder: processed.placeholder,
				variants: files.variants,
				altText: alt
			});
		}
	} catch (e) {
		for (const variants of stored) await removeFiles(store, variants).catch(() => undefined);
		throw e;
	}
};

export const down: Seeder = async () => {
	const store = storage();
	const guides = await Guide.findAll({
		where: { slug: GALLERIES.map((g) => g.guide) },
		attributes: ['id']
	});
	const parts = await Part.findAll({
		where: { slug: PART_PICTURES.map((p) => p.part) },
		attributes: ['id']
	});
	const photos = [
		...(await Photo.findAll({ where: { guideId: guides.map((g) => g.id) } })),
		...(await Photo.findAll({ where: { partId: parts.map((p) => p.id) } }))
	];
	for (const photo of photos) {
		await GalleryPhoto.destroy({ where: { photoId: photo.id } });
		await photo.destroy();
		await removeFiles(store, photo.variants).catch(() => undefined);
	}
};
