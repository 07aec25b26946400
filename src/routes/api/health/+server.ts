import { json } from '@sveltejs/kit';
import * as health from '$lib/server/services/health';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	const report = await health.check();
	return json(report, {
		status: report.db === 'up' ? 200 : 503,
		headers: { 'cache-control': 'no-store' }
	});
};
