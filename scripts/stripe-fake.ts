/*
 * Local stand-in for the payment provider's HTTP API (Stripe), for development and tests:
 * tsx scripts/stripe-fake.ts (normally started in the background by scripts/stripe-fake.sh).
 * The app talks to it through the official `stripe` SDK, pointed here by STRIPE_API_URL; no
 * card data exists anywhere: the hosted "pay" page has three buttons instead of a card form.
 *
 * HTTP on 127.0.0.1:${STRIPE_FAKE_PORT:-2600}; every /v1 call needs
 * "Authorization: Bearer $STRIPE_SECRET_KEY" and takes form-encoded bodies like the real API:
 *   POST /v1/checkout/sessions            create (mode=payment, one price_data line item)
 *   GET  /v1/checkout/sessions/:id        retrieve
 *   GET  /v1/checkout/sessions?payment_intent=pi_…   list (the real API's filter)
 *   GET  /v1/payment_intents/:id          retrieve (latest_charge.balance_transaction expanded
 *                                         when asked with expand[])
 *   POST /v1/refunds                      refund a payment_intent in full (Idempotency-Key kept)
 *   POST /v1/webhook_endpoints            register a URL that receives every event
 *   GET  /pay/:sessionId                  the hosted page: Pay, Decline, Cancel
 *   GET  /_fake/events                    what was sent where (for tests)
 *   GET  /health                          { ok }
 *
 * Webhooks are signed as the provider documents ("Verify webhook signatures manually"):
 * header Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<raw body>" keyed with
 * the endpoint secret (STRIPE_WEBHOOK_SECRET, the whole "whsec_…" string)>. Deliveries are
 * deliberately awkward, as the provider warns they can be: after a payment the events arrive
 * newest first, and checkout.session.completed is delivered twice with the same event id.
 *
 * Fees are an invented tariff (2.9 % of the amount rounded half up, plus 30 minor units when
 * the currency has minor units); they only need to be a number the app did not compute.
 */
import { createHmac, randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';

const HOST = '127.0.0.1';
const PORT = Number(process.env.STRIPE_FAKE_PORT ?? 2600);
const BASE = `http://${HOST}:${PORT}`;
const SECRET_KEY = process.env.STRIPE_SECRET_KEY ?? '';
const WEBHOOK_SECRET = process.env.STRIPE_WEBHOOK_SECRET ?? '';
const ZERO_DECIMAL = new Set(['jpy', 'krw', 'vnd', 'clp', 'isk', 'ugx', 'xaf', 'xof']);

type Obj = Record<string, unknown>;
interface Session extends Obj {
	id: string;
	amount_total: number;
	currency: string;
	payment_intent: string | null;
	success_url: string;
	cancel_url: string;
	status: string;
	payment_status: string;
	metadata: Record<string, string>;
}

const sessions = new Map<string, Session>();
const intents = new Map<string, Obj & { id: string; latest_charge: string | null }>();
const charges = new Map<string, Obj & { id: string; balance_transaction: string }>();
const balanceTransactions = new Map<string, Obj>();
const refundsByKey = new Map<string, Obj>();
const endpoints: { id: string; url: string }[] = [];
const deliveries: { eventId: string; type: string; url: string; status: number | string }[] = [];

function log(event: string, detail: Obj = {}) {
	console.log(
		JSON.stringify({ t: new Date().toISOString(), kind: 'stripe-fake', event, ...detail })
	);
}
const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);

/** Parses the SDK's form encoding (a[b][0][c]=v) into nested objects and arrays. */
function parseForm(body: string): Obj {
	const root: Obj = {};
	for (const [key, value] of new URLSearchParams(body)) {
		const path = key.replace(/\]/g, '').split('[');
		let node: Obj = root;
		path.forEach((part, i) => {
			if (i === path.length - 1) {
				if (part === '' && Array.isArray(node)) (node as unknown[]).push(value);
				else node[part] = value;
				return;
			}
			const nextIsIndex = /^\d*$/.test(path[i + 1] ?? '');
			node[part] ??= nextIsIndex ? [] : {};
			node = node[part] as Obj;
		});
	}
	return root;
}

function readBody(req: IncomingMessage): Promise<string> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		req.on('data', (c: Buffer) => chunks.push(c));
		req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
		req.on('error', reject);
	});
}

function send(res: ServerResponse, status: number, body: unknown) {
	res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req') });
	res.end(JSON.stringify(body));
}
function apiError(res: ServerResponse, status: number, message: string, param?: string) {
	send(res, status, { error: { type: 'invalid_request_error', message, param } });
}

function signature(payload: string, secret: string, timestamp = now()): string {
	const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex');
	return `t=${timestamp},v1=${v1}`;
}

function event(type: string, object: Obj, created = now()): Obj {
	return {
		id: newId('evt'),
		object: 'event',
		api_version: '2026-11-18.endive',
		created,
		livemode: false,
		pending_webhooks: endpoints.length,
		request: { id: null, idempotency_key: null },
		type,
		data: { object: structuredClone(object) }
	};
}

async function deliver(evt: Obj) {
	const payload = JSON.stringify(evt);
	for (const { url } of endpoints) {
		let status: number | string;
		try {
			const response = await fetch(url, {
				method: 'POST',
				headers: {
					'content-type': 'application/json; charset=utf-8',
					'stripe-signature': signature(payload, WEBHOOK_SECRET)
				},
				body: payload,
				signal: AbortSignal.timeout(10_000)
			});
			status = response.status;
		} catch (e) {
			status = e instanceof Error ? e.message : String(e);
		}
		deliveries.push({ eventId: String(evt.id), type: String(evt.type), url, status });
		log('delivered', { eventId: evt.id, type: evt.type, url, status });
	}
}

function feeFor(amount: number, currency: string): number {
	const percent = Math.floor((amount * 29 + 500) / 1000);
	return percent + (ZERO_DECIMAL.has(currency) ? 0 : 30);
}

function createSession(params: Obj): Session | string {
	const item = (params.line_items as Obj[] | undefined)?.[0];
	const price = item?.price_data as Obj | undefined;
	const amount = Number(price?.unit_amount);
	const quantity = Number(item?.quantity ?? 1);
	if (params.mode !== 'payment') return 'mode must be payment';
	if (!price || !Number.isSafeInteger(amount) || amount <= 0)
		return 'line_items[0][price_data][unit_amount] must be a positive integer';
	if (typeof params.success_url !== 'string' || typeof params.cancel_url !== 'string')
		return 'success_url and cancel_url are required';
	const id = newId('cs_test');
	const session: Session = {
		id,
		object: 'checkout.session',
		mode: 'payment',
		status: 'open',
		payment_status: 'unpaid',
		amount_total: amount * quantity,
		currency: String(price.currency).toLowerCase(),
		client_reference_id: (params.client_reference_id as string) ?? null,
		customer_email: (params.customer_email as string) ?? null,
		metadata: (params.metadata as Record<string, string>) ?? {},
		payment_intent: null,
		success_url: params.success_url.replace('{CHECKOUT_SESSION_ID}', id),
		cancel_url: params.cancel_url,
		url: `${BASE}/pay/${id}`,
		created: now(),
		livemode: false,
		product_name: String((price.product_data as Obj | undefined)?.name ?? 'Payment')
	};
	sessions.set(id, session);
	return session;
}

function intentFor(session: Session) {
	const existing = session.payment_intent ? intents.get(session.payment_intent) : undefined;
	if (existing) return existing;
	const intent = {
		id: newId('pi'),
		object: 'payment_intent',
		amount: session.amount_total,
		currency: session.currency,
		status: 'requires_payment_method',
		latest_charge: null as string | null,
		metadata: session.metadata,
		created: now(),
		livemode: false
	};
	intents.set(intent.id, intent);
	session.payment_intent = intent.id;
	return intent;
}

function succeed(session: Session) {
	const intent = intentFor(session);
	const txn = {
		id: newId('txn'),
		object: 'balance_transaction',
		amount: session.amount_total,
		currency: session.currency,
		fee: feeFor(session.amount_total, session.currency),
		net: 0
	};
	txn.net = txn.amount - txn.fee;
	balanceTransactions.set(txn.id, txn);
	const charge = {
		id: newId('ch'),
		object: 'charge',
		amount: session.amount_total,
		amount_refunded: 0,
		currency: session.currency,
		payment_intent: intent.id,
		balance_transaction: txn.id,
		paid: true,
		refunded: false,
		status: 'succeeded'
	};
	charges.set(charge.id, charge);
	Object.assign(intent, {
		status: 'succeeded',
		latest_charge: charge.id,
		last_payment_error: null
	});
	Object.assign(session, { status: 'complete', payment_status: 'paid' });
	const t = now();
	const completed = event('checkout.session.completed', session, t);
	const succeeded = event('payment_intent.succeeded', intent, t + 1);
	// Newest first, then the older one, then the older one again (same id): a redelivery.
	return [succeeded, completed, completed];
}

async function handlePay(req: IncomingMessage, res: ServerResponse, id: string, action?: string) {
	const session = sessions.get(id);
	if (!session)
		return void res
			.writeHead(404, { 'content-type': 'text/plain' })
			.end('No such checkout session\n');
	let notice = '';
	if (req.method === 'POST' && session.status === 'open') {
		if (action === 'cancel') return void res.writeHead(303, { location: session.cancel_url }).end();
		if (action === 'succeed') {
			const events = succeed(session);
			res.writeHead(303, { location: session.success_url }).end();
			// After the redirect, like the provider: the return and the webhook race.
			setTimeout(
				() => void events.reduce((p, e) => p.then(() => deliver(e)), Promise.resolve()),
				300
			);
			return;
		}
		if (action === 'decline') {
			const intent = intentFor(session);
			Object.assign(intent, {
				status: 'requires_payment_method',
				last_payment_error: { code: 'card_declined', message: 'Your card was declined.' }
			});
			void deliver(event('payment_intent.payment_failed', intent));
			notice = '<p role="alert">Your card was declined. Try again or cancel.</p>';
		}
	}
	const digits = ZERO_DECIMAL.has(session.currency) ? 0 : 2;
	const amount = (session.amount_total / 10 ** digits).toFixed(digits);
	const done = session.status !== 'open';
	res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
	res.end(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>Test payment</title><style>body{font-family:sans-serif;max-width:28rem;margin:2rem auto;padding:0 1rem}button{margin:.25rem;padding:.5rem 1rem}</style></head>
<body><h1>Test payment page</h1><p>Local fake of the payment provider. No card is asked for or stored.</p>
<p>${escapeHtml(String(session.product_name))}: <strong>${amount} ${session.currency.toUpperCase()}</strong></p>${notice}
${done ? '<p>This session is finished.</p>' : `<form method="post"><button formaction="/pay/${id}/succeed">Pay (test success)</button><button formaction="/pay/${id}/decline">Decline (test card declined)</button><button formaction="/pay/${id}/cancel">Cancel and go back</button></form>`}
</body></html>`);
}

function escapeHtml(s: string) {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function refund(params: Obj, key: string | undefined): Obj | string {
	const earlier = key ? refundsByKey.get(key) : undefined;
	if (earlier) return earlier;
	const intent = intents.get(String(params.payment_intent));
	if (!intent || intent.status !== 'succeeded' || !intent.latest_charge)
		return 'No succeeded payment_intent to refund';
	const charge = charges.get(intent.latest_charge);
	if (!charge) return 'No charge to refund';
	if (charge.refunded) return 'Charge has already been refunded';
	Object.assign(charge, { refunded: true, amount_refunded: charge.amount });
	const result = {
		id: newId('re'),
		object: 'refund',
		amount: charge.amount,
		currency: charge.currency,
		charge: charge.id,
		payment_intent: intent.id,
		status: 'succeeded',
		reason: params.reason ?? null
	};
	if (key) refundsByKey.set(key, result);
	setTimeout(() => void deliver(event('charge.refunded', charge)), 300);
	return result;
}

async function handleApi(req: IncomingMessage, res: ServerResponse, url: URL) {
	if (req.headers.authorization !== `Bearer ${SECRET_KEY}` || !SECRET_KEY) {
		return apiError(res, 401, 'Invalid API Key provided.');
	}
	const params =
		req.method === 'POST' ? parseForm(await readBody(req)) : parseForm(url.search.slice(1));
	const path = url.pathname;
	let m: RegExpExecArray | null;
	if (req.method === 'POST' && path === '/v1/checkout/sessions') {
		const s = createSession(params);
		return typeof s === 'string' ? apiError(res, 400, s) : send(res, 200, s);
	}
	if (req.method === 'GET' && path === '/v1/checkout/sessions') {
		const data = [...sessions.values()].filter((s) => s.payment_intent === params.payment_intent);
		return send(res, 200, { object: 'list', data, has_more: false, url: path });
	}
	if (req.method === 'GET' && (m = /^\/v1\/checkout\/sessions\/([\w]+)$/.exec(path))) {
		const s = sessions.get(m[1] ?? '');
		return s ? send(res, 200, s) : apiError(res, 404, `No such checkout.session: '${m[1]}'`, 'id');
	}
	if (req.method === 'GET' && (m = /^\/v1\/payment_intents\/([\w]+)$/.exec(path))) {
		const intent = intents.get(m[1] ?? '');
		if (!intent) return apiError(res, 404, `No such payment_intent: '${m[1]}'`, 'id');
		const expand = (params.expand as string[] | undefined) ?? [];
		const out: Obj = structuredClone(intent);
		if (intent.latest_charge && expand.some((e) => e.startsWith('latest_charge'))) {
			const charge: Obj = structuredClone(charges.get(intent.latest_charge) ?? {});
			if (expand.includes('latest_charge.balance_transaction'))
				charge.balance_transaction = balanceTransactions.get(String(charge.balance_transaction));
			out.latest_charge = charge;
		}
		return send(res, 200, out);
	}
	if (req.method === 'POST' && path === '/v1/refunds') {
		const key = req.headers['idempotency-key'];
		const r = refund(params, typeof key === 'string' ? key : undefined);
		return typeof r === 'string' ? apiError(res, 400, r) : send(res, 200, r);
	}
	if (req.method === 'POST' && path === '/v1/webhook_endpoints') {
		const url = String(params.url ?? '');
		let endpoint = endpoints.find((e) => e.url === url);
		if (!endpoint) endpoints.push((endpoint = { id: newId('we'), url }));
		return send(res, 200, { ...endpoint, object: 'webhook_endpoint', secret: WEBHOOK_SECRET });
	}
	apiError(res, 404, `Unrecognized request URL (${req.method}: ${path}).`);
}

async function handle(req: IncomingMessage, res: ServerResponse) {
	const url = new URL(req.url ?? '/', BASE);
	const pay = /^\/pay\/(cs_test_\w+)(?:\/(succeed|decline|cancel))?$/.exec(url.pathname);
	if (pay) return handlePay(req, res, pay[1] ?? '', pay[2]);
	if (url.pathname.startsWith('/v1/')) return handleApi(req, res, url);
	if (url.pathname === '/_fake/events') return send(res, 200, { deliveries });
	if (url.pathname === '/health') return send(res, 200, { ok: true });
	res.writeHead(404, { 'content-type': 'text/plain' }).end('Not found\n');
}

const server = createServer((req, res) => {
	handle(req, res).catch((e: unknown) => {
		log('error', { error: String(e) });
		if (!res.headersSent) res.writeHead(500).end();
	});
});
server.once('error', (e) => {
	console.error(`Payment provider fake could not listen on ${HOST}:${PORT}: ${e.message}`);
	process.exit(1);
});
server.listen(PORT, HOST, () => log('ready', { url: BASE }));

function shutdown(signal: string) {
	log('stopping', { signal });
	setTimeout(() => process.exit(0), 2_000).unref();
	server.close(() => process.exit(0));
	server.closeAllConnections();
}
process.once('SIGTERM', () => shutdown('SIGTERM'));
process.once('SIGINT', () => shutdown('SIGINT'));
