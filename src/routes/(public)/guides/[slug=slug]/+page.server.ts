import { error } from '@sveltejs/kit';
import { revisionCompareQuery } from '$lib/schemas/guide-page';
import { regionQuery } from '$lib/schemas/guides';
import * as guides from '$lib/server/services/guides';
import type { RevisionDiff } from '$lib/server/services/guide-views';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	// ?region=xx works without JavaScript; a bad or unknown code falls back to the base region.
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const wanted = query.success ? (query.data.region ?? null) : null;
	let outcome = await guides.getGuidePage(params.slug, wanted);
	let regionProblem = query.success ? null : 'That is not a region code.';
	if (outcome.kind === 'unknown_region') {
		regionProblem = `We have no region “${wanted}”. Showing the guide's base region.`;
		outcome = await guides.getGuidePage(params.slug, null);
	}
	if (outcome.kind !== 'ok') error(404, 'Guide not found');
	const { guide, extras } = outcome.page;

	// ?from=&to= compares two published revisions (GET form in the revision history).
	const latest = guide.revisionNumber;
	let compare = { from: Math.max(1, latest - 1), to: latest };
	let diff: RevisionDiff | null = null;
	let compareProblem: string | null = null;
	if (url.searchParams.has('from') || url.searchParams.has('to')) {
		const parsed = revisionCompareQuery.safeParse({ from: url.searchParams.get('from'), to: url.searchParams.get('to') });
		if (!parsed.success) {
			compareProblem = parsed.error.issues[0]?.message ?? 'Pick two revisions.';
		} else {
			compare = parsed.data;
			const result = await guides.getRevisionDiff(params.slug, parsed.data.from, parsed.data.to);
			if (result.kind === 'ok') diff = result.diff;
			else compareProblem = 'This guide has no such published revision.';
		}
	}
	return { guide, extras, regionProblem, compare, diff, compareProblem };
};
