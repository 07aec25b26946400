import { partListQuery } from '$lib/schemas/catalog-upkeep';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as catalogReads from '$lib/server/services/catalog-reads';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const raw = {
		q: url.searchParams.get('q') ?? undefined,
		category: url.searchParams.get('category') ?? undefined,
		page: url.searchParams.get('page') ?? undefined
	};
	const parsed = partListQuery.safeParse(raw);
	// A bad filter shows everything with a note rather than an error page.
	const query = parsed.success ? parsed.data : { q: '', category: undefined, page: 1 };
	const result = await catalogReads.listParts(query);
	return { result, query, issues: parsed.success ? {} : fieldIssues(parsed.error) };
};
