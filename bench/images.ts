/*
 * Benchmark (not a test): the photo pipeline on a 24-megapixel JPEG (6000 × 4000), against
 * sharp making one WebP of the same image in the same run. The pipeline does much more
 * (the upload request's checks, the original kept and removed, orientation, three widths in
 * AVIF and WebP, a JPEG fallback, a placeholder, every file written to a disk store); the
 * ratio says what that costs over the least any upload path would do.
 *
 * Each measurement runs in a fresh child process, so its peak memory (the process's maximum
 * resident set, from the kernel) is its own and not what an earlier run left behind. Rounds
 * alternate the two sides; figures are medians over rounds.
 *
 * The image is our own drawing (gradients and shapes rendered by sharp), not a photograph.
 *
 * Run: npm run bench:images. Options (env): BENCH_ROUNDS (3).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import sharp from 'sharp';
import { checkUpload, processPhoto } from '../src/lib/server/images/pipeline';
import { newOriginalKey, storeFiles } from '../src/lib/server/images/store-photo';
import { diskStorage } from '../src/lib/server/storage/disk';
import type { ObjectStorage } from '../src/lib/server/storage/types';
import { ROOT, machineNotes, writeBenchSection } from './lib/harness';

const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3);
const WIDTH = 6000;
const HEIGHT = 4000;

type Side = 'pipeline' | 'one-webp';
interface Figures {
	ms: number;
	peakMb: number;
	outputs: number;
}

/** A drawn 24-megapixel scene: smooth gradients, hard edges and grain, like a photo's mix. */
async function drawnJpeg(): Promise<Buffer> {
	const shapes = Array.from({ length: 40 }, (_, i) => {
		const x = (i * 1543) % WIDTH;
		const y = (i * 977) % HEIGHT;
		const hue = (i * 37) % 360;
		return `<rect x="${x}" y="${y}" width="${300 + (i % 7) * 90}" height="${200 + (i % 5) * 80}" rx="24" fill="hsl(${hue},45%,55%)" opacity="0.8"/>`;
	}).join('');
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}">
		<defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="1">
			<stop offset="0" stop-color="#2f4858"/><stop offset="1" stop-color="#d8c9a7"/>
		</linearGradient></defs>
		<rect width="100%" height="100%" fill="url(#g)"/>${shapes}</svg>`;
	const drawing = await sharp(Buffer.from(svg)).png().toBuffer();
	// Fine grain over the drawing, as a camera sensor leaves: without it the JPEG is a few
	// hundred kilobytes, far from the 5–12 MB a 24-megapixel camera file weighs.
	return sharp({
		create: {
			width: WIDTH,
			height: HEIGHT,
			channels: 3,
			noise: { type: 'gaussian', mean: 128, sigma: 18 }
		}
	})
		.composite([{ input: drawing, blend: 'overlay' }])
		.jpeg({ quality: 90 })
		.toBuffer();
}

/**
 * What an upload goes through, end to end, as services/photos.ts and the photo worker do it:
 * the request's checks, the original kept, every variant made and stored on disk, the
 * original removed. Returns the files made (variants and the placeholder).
 */
async function wholePipeline(input: Buffer, store: ObjectStorage): Promise<number> {
	await checkUpload(input);
	const original = newOriginalKey();
	await store.put(original, input, 'image/jpeg');
	const photo = await processPhoto((await store.get(original))?.body ?? input);
	await storeFiles(store, photo);
	await store.delete([original]);
	return photo.variants.length + 1;
}

/** Child side: one measurement, printed as JSON. */
async function child(side: Side, file: string): Promise<void> {
	const input = readFileSync(file);
	const folder = mkdtempSync(join(tmpdir(), 'slotwise-bench-store-'));
	const t0 = performance.now();
	let outputs = 1;
	if (side === 'pipeline') outputs = await wholePipeline(input, diskStorage(folder));
	else await sharp(input).webp({ quality: 78, effort: 4 }).toBuffer();
	const ms = performance.now() - t0;
	rmSync(folder, { recursive: true, force: true });
	// maxRSS is in kilobytes.
	const peakMb = process.resourceUsage().maxRSS / 1024;
	process.stdout.write(JSON.stringify({ ms, peakMb, outputs } satisfies Figures));
}

function measure(side: Side, file: string): Figures {
	const run = spawnSync(
		process.execPath,
		['--import', 'tsx', fileURLToPath(import.meta.url), '--child', side, file],
		{ cwd: ROOT, encoding: 'utf8' }
	);
	if (run.status !== 0) throw new Error(`${side} failed: ${run.stderr}`);
	return JSON.parse(run.stdout) as Figures;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? 0;

async function main(): Promise<void> {
	const folder = mkdtempSync(join(tmpdir(), 'slotwise-bench-images-'));
	try {
		const file = join(folder, 'drawn-24mp.jpg');
		const input = await drawnJpeg();
		writeFileSync(file, input);
		const runs: Record<Side, Figures[]> = { pipeline: [], 'one-webp': [] };
		for (let round = 0; round < ROUNDS; round++) {
			const order: Side[] = round % 2 === 0 ? ['one-webp', 'pipeline'] : ['pipeline', 'one-webp'];
			for (const side of order) runs[side].push(measure(side, file));
			console.log(`round ${round + 1}/${ROUNDS} done`);
		}
		const figures = (side: Side) => ({
			ms: median(runs[side].map((r) => r.ms)),
			peakMb: median(runs[side].map((r) => r.peakMb)),
			outputs: runs[side][0]?.outputs ?? 0
		});
		const p = figures('pipeline');
		const b = figures('one-webp');
		const lines = [
			'## Photo pipeline (`npm run bench:images`)',
			'',
			`${new Date().toISOString().slice(0, 10)}, ${machineNotes()}. A drawn ${WIDTH} × ${HEIGHT} JPEG`,
			`(${(input.byteLength / 1024 / 1024).toFixed(1)} MB), each side in a fresh process, medians of ${ROUNDS} alternating rounds.`,
			'',
			'| side | wall time (ms) | peak memory (MB, max RSS) | files out |',
			'| --- | --: | --: | --: |',
			`| whole pipeline (upload checks, original kept, orientation, 3 widths × AVIF + WebP, JPEG, placeholder, all stored on disk) | ${p.ms.toFixed(0)} | ${p.peakMb.toFixed(0)} | ${p.outputs} |`,
			`| sharp alone: one full-size WebP | ${b.ms.toFixed(0)} | ${b.peakMb.toFixed(0)} | ${b.outputs} |`,
			`| ratio pipeline / one WebP | ${(p.ms / b.ms).toFixed(2)} × | ${(p.peakMb / b.peakMb).toFixed(2)} × | |`
		];
		console.log(lines.join('\n'));
		writeBenchSection('images', lines);
	} finally {
		rmSync(folder, { recursive: true, force: true });
	}
}

const at = process.argv.indexOf('--child');
if (at >= 0) await child(process.argv[at + 1] as Side, process.argv[at + 2] ?? '');
else await main();
