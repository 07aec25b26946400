import { parseLenient, queryRecord } from '$lib/schemas/query-params';
import { reviewQueueQuery } from '$lib/schemas/review';
import { requireRole } from '$lib/server/auth/guards';
import * as reviewQueue from '$lib/server/services/review-queue';
import type { PageServerLoad } from './$types';

const KEYS = ['page', 'kind', 'sort', 'author'] as const;

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const { raw, repeated } = queryRecord(url.searchParams);
	const { query, issues } = parseLenient(reviewQueueQuery, KEYS, raw, repeated);
	return { queue: await reviewQueue.listQueue(query), query, issues };
};
