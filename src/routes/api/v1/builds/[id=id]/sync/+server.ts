import { getSyncPlan, postSync } from '$lib/server/api/build-sync';
import type { RequestHandler } from './$types';

/** The build's sync with its source guide: owner only (404 otherwise), applied with optimistic locking. */
export const GET: RequestHandler = (event) => getSyncPlan(event);
export const POST: RequestHandler = (event) => postSync(event);
