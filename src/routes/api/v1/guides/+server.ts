import { json } from '@sveltejs/kit';
import { parseGuideBrowseStrict } from '$lib/schemas/guide-browse';
import * as guideBrowse from '$lib/server/services/guide-browse';
import { createGuide as createGuideDraft } from '$lib/server/api/guide-drafts';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/guides?region=&base=&min=&max=&tag=&tag=&sort=newest|total|value&page=
 * → { items, total, page, pageCount, region }. Budgets are whole units of `region`'s currency;
 * sort=total and sort=value need `region` (400 otherwise). Each item's `fpsPer100` is the
 * guide page's value in that region (null without frame results or a complete total; those sort last).
 */
export const GET: RequestHandler = async ({ url }) => {
	const parsed = parseGuideBrowseStrict(url.searchParams);
	if (!parsed.ok)
		return json(
			{ message: 'The browse parameters are not valid.', issues: parsed.issues },
			{ status: 400 }
		);
	const outcome = await guideBrowse.browse(parsed.query);
	if (outcome.kind === 'unknown_region') {
		const code = parsed.query[outcome.field];
		return json(
			{ message: 'Unknown region', issues: { [outcome.field]: [`No region "${code}".`] } },
			{ status: 400 }
		);
	}
	const { items, total, page, pageCount, region } = outcome.result;
	return json({ items, total, page, pageCount, region });
};

/** POST /api/v1/guides: an author creates a draft guide (handler in $lib/server/api/guide-drafts). */
export const POST: RequestHandler = (event) => createGuideDraft(event);
