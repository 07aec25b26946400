import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guards';
import * as mailings from '$lib/server/services/mailings';
import type { RequestHandler } from './$types';

/** The mailing page polls this while a mailing is sending (sent / failed / remaining). */
export const GET: RequestHandler = async ({ params }) => {
	requireRole('editor');
	const progress = await mailings.progress(Number(params.id));
	if (!progress) error(404, 'No such mailing');
	return json(progress, { headers: { 'cache-control': 'no-store' } });
};
