import { json } from '@sveltejs/kit';
import * as parts from '$lib/server/services/parts';
import type { PartDetail } from '$lib/views';
import type { RequestHandler } from './$types';

/** GET /api/v1/parts/[slug] → PartDetail, or 404 { message }. */
export const GET: RequestHandler = async ({ params, url }) => {
	// No query parameters are defined here; refusing them keeps the API strict like the search.
	const unknown = [...new Set(url.searchParams.keys())];
	if (unknown.length > 0) {
		return json(
			{
				message: 'This address takes no query parameters.',
				issues: { _form: unknown.map((k) => `Unrecognized key: "${k}"`) }
			},
			{ status: 400 }
		);
	}
	const part: PartDetail | null = await parts.getBySlug(params.slug);
	if (!part) return json({ message: 'No part has that slug.' }, { status: 404 });
	return json(part);
};
