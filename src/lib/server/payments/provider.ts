/*
 * The payment provider's SDK (Stripe's official `stripe` package), configured from the
 * environment. Relative imports and plain process.env only, so scripts and tests can use it.
 *
 *   STRIPE_SECRET_KEY      the API key (sk_…); read here and handed to the SDK, never logged
 *   STRIPE_WEBHOOK_SECRET  the endpoint's signing secret (whsec_…), for verifying webhooks
 *   STRIPE_API_URL         where the API lives: unset means the provider itself; npm start
 *                          and npm test point it at the local fake (scripts/stripe-fake.ts)
 *
 * Card data never passes through Slotwise: readers pay on the provider's hosted page.
 */
import Stripe from 'stripe';

export class PaymentsNotConfigured extends Error {
	override readonly name = 'PaymentsNotConfigured';
}

let client: Stripe | null = null;

function configured(name: 'STRIPE_SECRET_KEY' | 'STRIPE_WEBHOOK_SECRET'): string {
	const value = process.env[name] ?? '';
	// The message names the variable only, never its value.
	if (!value) throw new PaymentsNotConfigured(`${name} is not set: tips are unavailable.`);
	return value;
}

export function paymentsAvailable(): boolean {
	return Boolean(process.env.STRIPE_SECRET_KEY && process.env.STRIPE_WEBHOOK_SECRET);
}

/** The process-wide SDK client. */
export function provider(): Stripe {
	if (client) return client;
	const apiUrl = process.env.STRIPE_API_URL ? new URL(process.env.STRIPE_API_URL) : null;
	client = new Stripe(configured('STRIPE_SECRET_KEY'), {
		...(apiUrl && {
			host: apiUrl.hostname,
			port: apiUrl.port || (apiUrl.protocol === 'http:' ? 80 : 443),
			protocol: apiUrl.protocol === 'http:' ? 'http' : 'https'
		}),
		// One retry on a network error; every creating call carries an idempotency key.
		maxNetworkRetries: 1,
		timeout: 10_000,
		telemetry: false
	});
	return client;
}

export function webhookSecret(): string {
	return configured('STRIPE_WEBHOOK_SECRET');
}

/** The provider's documented default: events signed more than 5 minutes ago are refused. */
export const WEBHOOK_TOLERANCE_SECONDS = 300;
