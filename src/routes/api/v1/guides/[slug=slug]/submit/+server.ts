import { submitDraft } from '$lib/server/api/guide-drafts';
import type { RequestHandler } from './$types';

/** Freezes the working copy as a revision for review: owner only, version-checked. */
export const POST: RequestHandler = (event) => submitDraft(event);
