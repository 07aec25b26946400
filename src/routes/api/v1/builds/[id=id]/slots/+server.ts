import { postSlot } from '$lib/server/api/builds';
import type { RequestHandler } from './$types';

/** Adds a slot of the reader's own to their build: owner only, version-checked. */
export const POST: RequestHandler = (event) => postSlot(event);
