import { parseGuideBrowseLenient } from '$lib/schemas/guide-browse';
import * as guideBrowse from '$lib/server/services/guide-browse';
import type { PageServerLoad } from './$types';

/** Guide browse from the URL; a bad parameter is reported and dropped, not fatal. */
export const load: PageServerLoad = async ({ url }) => {
	const { query, issues } = parseGuideBrowseLenient(url.searchParams);
	// A budget the reader asked for but we could not apply (no region, lowest above highest)
	// must not be answered with every guide under the message as if it had been (issue 15).
	const budgetRejected = Boolean(issues.min || issues.max);
	let outcome = await guideBrowse.browse(query);
	if (outcome.kind === 'unknown_region') {
		// An unknown region drops that filter (and what depends on it) rather than the page.
		const field = outcome.field;
		(issues[field] ??= []).push(`No region "${query[field]}"; showing guides from every region.`);
		const retry =
			field === 'region'
				? { ...query, region: undefined, min: undefined, max: undefined, sort: 'newest' as const }
				: { ...query, base: undefined };
		outcome = await guideBrowse.browse(retry);
		if (outcome.kind !== 'ok')
			outcome = await guideBrowse.browse({ ...retry, region: undefined, base: undefined });
		if (outcome.kind === 'ok')
			return { query: retry, issues, budgetRejected, result: outcome.result };
	}
	if (outcome.kind !== 'ok') throw new Error('guide browse without filters failed');
	return { query, issues, budgetRejected, result: outcome.result };
};
