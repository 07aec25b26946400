import { postUndoSync } from '$lib/server/api/build-sync';
import type { RequestHandler } from './$types';

/** Undo the build's last sync: owner only (404 otherwise), with optimistic locking. */
export const POST: RequestHandler = (event) => postUndoSync(event);
