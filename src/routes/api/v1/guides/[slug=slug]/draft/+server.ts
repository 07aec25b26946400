import { getDraft, saveDraft } from '$lib/server/api/guide-drafts';
import type { RequestHandler } from './$types';

/** The author's working copy: owner only (404 otherwise), saved with optimistic locking. */
export const GET: RequestHandler = (event) => getDraft(event);
export const PUT: RequestHandler = (event) => saveDraft(event);
