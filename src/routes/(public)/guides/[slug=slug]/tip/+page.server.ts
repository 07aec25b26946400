import { error, fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { regionQuery } from '$lib/schemas/guides';
import { fieldIssues } from '$lib/schemas/issues';
import { tipInput } from '$lib/schemas/tips';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import * as limits from '$lib/server/rate-limit';
import { tipChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as tips from '$lib/server/services/tips';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const target = await tips.tipTarget(
		params.slug,
		query.success ? (query.data.region ?? null) : null
	);
	if (!target) error(404, 'Guide not found');
	// ?currency= switches the form to another currency Slotwise prices in (a GET link, no JS).
	const asked = url.searchParams.get('currency');
	if (asked && target.currencies.some((c) => c.code === asked)) target.currency = asked;
	const buildId = /^[1-9][0-9]{0,9}$/.test(url.searchParams.get('build') ?? '')
		? url.searchParams.get('build')
		: null;
	return {
		target,
		buildId,
		cancelled: url.searchParams.get('cancelled') === '1',
		signedIn: currentUser() !== null,
		ownGuide: currentUser()?.id === target.author.id
	};
};

export const actions: Actions = {
	/** Opens a checkout at the payment provider and sends the reader to its pay page. */
	default: async ({ params, request, url }) => {
		const me = requireUser();
		const fields = formFields(await request.formData());
		const input = tipInput.safeParse(fields);
		if (!input.success) return fail(400, { issues: fieldIssues(input.error), fields });
		const allowed = await limits.consumeAll(tipChecks(me.id));
		if (!allowed.ok) return tooManyRequests(allowed, undefined, { issues: {}, fields });
		const outcome = await tips.startTip(me, params.slug, input.data, url.origin);
		if (outcome.kind === 'not_found') error(404, 'Guide not found');
		if (outcome.kind === 'refused')
			return fail(409, { message: outcome.message, issues: {}, fields });
		redirect(303, outcome.checkoutUrl);
	}
};
