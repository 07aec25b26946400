import { error } from '@sveltejs/kit';
import { checkoutReturnQuery } from '$lib/schemas/tips';
import { requireUser } from '$lib/server/auth/guards';
import * as tips from '$lib/server/services/tips';
import type { PageServerLoad } from './$types';

/** Where the payment provider sends the reader back; only the supporter sees their tip. */
export const load: PageServerLoad = async ({ url }) => {
	const me = requireUser();
	const query = checkoutReturnQuery.safeParse({
		session_id: url.searchParams.get('session_id') ?? undefined
	});
	if (!query.success) error(404, 'Tip not found');
	const tip = await tips.thankYou(me.id, query.data.session_id);
	if (!tip) error(404, 'Tip not found');
	return { tip };
};
