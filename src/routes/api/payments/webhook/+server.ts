import { json } from '@sveltejs/kit';
import { receiveWebhook } from '$lib/server/services/tip-ledger';
import type { RequestHandler } from './$types';

/*
 * The payment provider's webhook. No session: the provider proves itself with the signature
 * over the exact bytes, so the body is read as text and never parsed before the check. A
 * refused event answers 400 (the provider retries, which is right for a delivery that was
 * ours but went wrong in transit); accepted and duplicate events answer 200.
 */
export const POST: RequestHandler = async ({ request, url }) => {
	const rawBody = await request.text();
	const result = await receiveWebhook(rawBody, request.headers.get('stripe-signature'), url.origin);
	if (result.kind === 'refused')
		return json({ message: 'Webhook refused.', reason: result.reason }, { status: 400 });
	return json({ received: true, duplicate: result.kind === 'duplicate' });
};
