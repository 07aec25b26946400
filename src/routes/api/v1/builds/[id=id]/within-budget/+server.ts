import { postWithinBudget } from '$lib/server/api/build-sync';
import type { RequestHandler } from './$types';

/** Proposed swaps that bring the build within a budget: owner only (404 otherwise); changes nothing. */
export const POST: RequestHandler = (event) => postWithinBudget(event);
