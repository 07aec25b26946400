import { postDeclineSync } from '$lib/server/api/build-sync';
import type { RequestHandler } from './$types';

/** "Not now" to the offered revision: owner only (404 otherwise); the build does not change. */
export const POST: RequestHandler = (event) => postDeclineSync(event);
