/*
 * The photo worker inside the app process (src/hooks.server.ts starts it), like the mail
 * queue's inline worker: `npm start` and the end-to-end tests process uploads with no extra
 * process. Several app processes each run one; they share the waiting photos through leases.
 */
import { db } from '../db/connection.js';
import { storage } from '../storage/index.js';
import { PhotoWorker, photoJobSettingsFromEnv } from './photo-jobs.js';

let inline: PhotoWorker | null = null;

export function startPhotoWorker(env: NodeJS.ProcessEnv = process.env): PhotoWorker {
	if (inline) return inline;
	inline = new PhotoWorker(db(), storage, photoJobSettingsFromEnv(env));
	inline.start();
	return inline;
}

/** A photo was uploaded: start on it now rather than at the next poll. */
export function pokePhotoWorker(): void {
	inline?.poke();
}

export async function stopPhotoWorker(): Promise<void> {
	const worker = inline;
	inline = null;
	await worker?.stop();
}
