import { error, fail } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { fieldIssues } from '$lib/schemas/issues';
import { refundInput } from '$lib/schemas/tips';
import { requireRole } from '$lib/server/auth/guards';
import { refundTip } from '$lib/server/services/tip-ledger';
import { listForAdmin } from '$lib/server/services/tip-earnings';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('admin');
	const page = Number(url.searchParams.get('page') ?? '1');
	return { tips: await listForAdmin(Number.isSafeInteger(page) && page > 0 ? page : 1) };
};

export const actions: Actions = {
	/** Refunds a paid tip in full through the payment provider; both people are told. */
	refund: async ({ request, url }) => {
		const me = requireRole('admin');
		const input = refundInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { issues: fieldIssues(input.error) });
		const outcome = await refundTip(input.data.tipId, me.id, url.origin);
		if (outcome.kind === 'not_found') error(404, 'Tip not found');
		if (outcome.kind === 'conflict') return fail(409, { message: outcome.message });
		if (outcome.kind === 'provider_error')
			return fail(502, { message: `The payment provider refused: ${outcome.message}` });
		return { refunded: input.data.tipId, message: `Refunded ${outcome.amount}.` };
	}
};
