import { parseLenient, queryRecord } from '$lib/schemas/query-params';
import { reviewQueueQuery } from '$lib/schemas/review';
import { requireRole } from '$lib/server/auth/guards';
import * as reviews from '$lib/server/services/guide-reviews';
import type { PageServerLoad } from './$types';

const KEYS = ['page', 'kind', 'sort', 'author'] as const;

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const { raw, repeated } = queryRecord(url.searchParams);
	const { query, issues } = parseLenient(reviewQueueQuery, KEYS, raw, repeated);
	return { queue: await reviews.listQueue(query), query, issues };
};
