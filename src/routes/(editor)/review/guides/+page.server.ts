import { parseLenient, queryRecord } from '$lib/schemas/query-params';
import { guideStateQuery } from '$lib/schemas/review';
import { requireRole } from '$lib/server/auth/guards';
import * as reviewQueue from '$lib/server/services/review-queue';
import type { PageServerLoad } from './$types';

const KEYS = ['page', 'state', 'q'] as const;

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const { raw, repeated } = queryRecord(url.searchParams);
	const { query, issues } = parseLenient(guideStateQuery, KEYS, raw, repeated);
	return { guides: await reviewQueue.listGuides(query), query, issues };
};
