import { postApplyWithinBudget } from '$lib/server/api/build-sync';
import type { RequestHandler } from './$types';

/** Apply the within-budget swaps as one change: owner only (404 otherwise), with optimistic locking. */
export const POST: RequestHandler = (event) => postApplyWithinBudget(event);
