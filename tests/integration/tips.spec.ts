import { createHmac, randomBytes } from 'node:crypto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { tipInput } from '../../src/lib/schemas/tips';
import { Guide, PaymentEvent, Tip, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { earnings, earningsCsv } from '../../src/lib/server/services/tip-earnings';
import { receiveWebhook, refundTip } from '../../src/lib/server/services/tip-ledger';
import * as tips from '../../src/lib/server/services/tips';
import { DEMO_SLUG, newReader } from '../support/buildsync-fixtures';
import { resetDatabase } from '../support/db';
import { listMessages, waitForMessage } from '../support/mailbox';
import { drainMailQueue } from '../support/mail-queue';
import { settled } from '../../src/lib/server/background';

/*
 * Tips against the real MariaDB and the local payment provider fake (scripts/stripe-fake.ts),
 * through the official SDK. The webhook events are signed here, independently of the app,
 * the way the provider documents it ("Check the webhook signatures" / "Verify manually",
 * from memory): Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 over "<t>.<body>"
 * keyed with the endpoint secret>. npm test starts the fake and exports STRIPE_API_URL,
 * STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET.
 */

const ORIGIN = 'http://127.0.0.1:4173';
const API = () => process.env.STRIPE_API_URL ?? '';
const KEY = () => process.env.STRIPE_SECRET_KEY ?? '';
const SECRET = () => process.env.STRIPE_WEBHOOK_SECRET ?? '';

function sign(payload: string, secret = SECRET(), at = Math.floor(Date.now() / 1000)): string {
	const v1 = createHmac('sha256', secret).update(`${at}.${payload}`).digest('hex');
	return `t=${at},v1=${v1}`;
}

function eventJson(
	type: string,
	object: unknown,
	id = `evt_test_${randomBytes(8).toString('hex')}`
) {
	return JSON.stringify({
		id,
		object: 'event',
		api_version: '2026-11-18.endive',
		created: Math.floor(Date.now() / 1000),
		livemode: false,
		pending_webhooks: 1,
		request: { id: null, idempotency_key: null },
		type,
		data: { object }
	});
}

async function fakeGet(path: string): Promise<Record<string, unknown>> {
	const response = await fetch(`${API()}${path}`, {
		headers: { authorization: `Bearer ${KEY()}` }
	});
	expect(response.ok, `GET ${path}`).toBe(true);
	return (await response.json()) as Record<string, unknown>;
}

/** The reader presses "Pay" on the fake's hosted page; returns the session and its intent. */
async function payAtFake(sessionId: string) {
	const response = await fetch(`${API()}/pay/${sessionId}/succeed`, {
		method: 'POST',
		redirect: 'manual'
	});
	expect(response.status).toBe(303);
	const session = await fakeGet(`/v1/checkout/sessions/${sessionId}`);
	const intent = await fakeGet(`/v1/payment_intents/${String(session.payment_intent)}`);
	return { session, intent };
}

let author: User;
let reader: User;

// Tip mails are queued after the answer (runLater): none may outlive its test.
afterEach(settled);

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	// A fresh author and reader per test, so each mailbox check sees only this test's mail.
	author = await User.create({
		email: `tip-author-${randomBytes(4).toString('hex')}@slotwise.test`,
		name: 'Ines Author',
		role: 'author',
		emailVerified: new Date()
	});
	await Guide.update({ authorId: author.id }, { where: { slug: DEMO_SLUG } });
	reader = await newReader('tipper');
});

async function startTip(fields: Record<string, string>) {
	const input = tipInput.parse(fields);
	const outcome = await tips.startTip(reader, DEMO_SLUG, input, ORIGIN);
	if (outcome.kind !== 'ok') throw new Error(`startTip: ${JSON.stringify(outcome)}`);
	const tip = await Tip.findOne({ where: { supporterId: reader.id }, order: [['id', 'DESC']] });
	return { tip: tip!, checkoutUrl: outcome.checkoutUrl };
}

describe('amounts are exact in minor units', () => {
	it('JPY has no minor unit: ¥500 is 500 at the provider and in the ledger', async () => {
		// ISO 4217: JPY exponent 0 (docs/sources.md, ISO 4217 row; from memory of the standard).
		const { tip } = await startTip({ currency: 'JPY', amount: 'custom', customAmount: '500' });
		expect(tip.amountMinor).toBe(500);
		expect(tip.currency).toBe('JPY');
		const session = await fakeGet(`/v1/checkout/sessions/${tip.checkoutSessionId}`);
		expect(session.amount_total).toBe(500);
		expect(session.currency).toBe('jpy');
		expect(
			tipInput.safeParse({ currency: 'JPY', amount: 'custom', customAmount: '500.5' }).success
		).toBe(false);
	});

	it('EUR has two decimals: €7.50 is 750 cents at the provider and in the ledger', async () => {
		// ISO 4217: EUR exponent 2, so 7.50 EUR = 750 minor units (worked by hand).
		const { tip } = await startTip({ currency: 'EUR', amount: 'custom', customAmount: '7,50' });
		expect(tip.amountMinor).toBe(750);
		const session = await fakeGet(`/v1/checkout/sessions/${tip.checkoutSessionId}`);
		expect(session.amount_total).toBe(750);
		expect(session.currency).toBe('eur');
	});

	it('refuses amounts outside the stated limits and starts nothing', async () => {
		// Limits stated on the form (domain/tips.ts, our own choice): EUR 1.00 to 200.00.
		const low = tipInput.safeParse({ currency: 'EUR', amount: 'custom', customAmount: '0.99' });
		const high = tipInput.safeParse({ currency: 'EUR', amount: 'custom', customAmount: '200.01' });
		expect(low.success).toBe(false);
		expect(high.success).toBe(false);
		expect(low.error?.issues[0]?.message).toBe('Tips are between €1.00 and €200.00.');
		expect(await Tip.count()).toBe(0);
	});
});

describe('webhooks', () => {
	it('forged, unsigned, stale and tampered events are refused and change nothing', async () => {
		const { tip } = await startTip({ currency: 'EUR', amount: '500' });
		const { session } = await payAtFake(tip.checkoutSessionId);
		const body = eventJson('checkout.session.completed', session);

		expect(await receiveWebhook(body, null, ORIGIN)).toEqual({
			kind: 'refused',
			reason: 'unsigned'
		});
		const forged = sign(body, `whsec_${randomBytes(24).toString('base64url')}`);
		expect(await receiveWebhook(body, forged, ORIGIN)).toEqual({
			kind: 'refused',
			reason: 'bad_signature'
		});
		// Signed correctly but 10 minutes ago: outside the provider's 5-minute default tolerance.
		const stale = sign(body, SECRET(), Math.floor(Date.now() / 1000) - 600);
		expect(await receiveWebhook(body, stale, ORIGIN)).toEqual({ kind: 'refused', reason: 'stale' });
		const tampered = body.replace('"amount_total":500', '"amount_total":50000');
		expect(tampered).not.toBe(body);
		expect(await receiveWebhook(tampered, sign(body), ORIGIN)).toEqual({
			kind: 'refused',
			reason: 'bad_signature'
		});

		await tip.reload();
		expect(tip.status).toBe('pending');
		expect(tip.paidAt).toBeNull();
		expect(await PaymentEvent.count()).toBe(0);
	});

	it('a replayed event changes nothing; out-of-order events count the payment once', async () => {
		const { tip } = await startTip({
			currency: 'EUR',
			amount: '500',
			note: 'Built it in a weekend, thanks!'
		});
		const { session, intent } = await payAtFake(tip.checkoutSessionId);
		const completed = eventJson('checkout.session.completed', session);
		const succeeded = eventJson('payment_intent.succeeded', intent);

		// The newer event first, as the fake also delivers them.
		const first = await receiveWebhook(succeeded, sign(succeeded), ORIGIN);
		expect(first).toMatchObject({ kind: 'accepted', outcome: 'applied', tipId: tip.id });
		const second = await receiveWebhook(completed, sign(completed), ORIGIN);
		expect(second).toMatchObject({ kind: 'accepted', outcome: 'unchanged', tipId: tip.id });
		// The same event again, freshly signed (a redelivery or a replay).
		const replay = await receiveWebhook(completed, sign(completed), ORIGIN);
		expect(replay.kind).toBe('duplicate');

		await tip.reload();
		expect(tip.status).toBe('paid');
		expect(tip.amountMinor).toBe(500);
		// The fake's invented tariff (scripts/stripe-fake.ts): floor((500 × 29 + 500) / 1000) = 15,
		// plus 30 for a currency with minor units = 45 cents. Worked by hand.
		expect(tip.feeMinor).toBe(45);
		expect(await PaymentEvent.count()).toBe(2);

		// The mails wait in the mail queue (MariaDB) for a worker: send what is queued.
		await settled();
		await drainMailQueue();
		const receipt = await waitForMessage({ to: reader.email, subject: /receipt/ });
		expect(receipt.text).toContain('€5.00');
		const notice = await waitForMessage({ to: author.email, subject: /tipped you/ });
		expect(notice.text).toContain('Built it in a weekend, thanks!');
		await new Promise((resolve) => setTimeout(resolve, 500));
		const all = await listMessages();
		expect(all.filter((m) => m.to.includes(reader.email))).toHaveLength(1);
		expect(all.filter((m) => m.to.includes(author.email))).toHaveLength(1);

		const summary = await earnings(author.id);
		expect(summary.totals).toHaveLength(1);
		expect(summary.totals[0]).toMatchObject({
			currency: 'EUR',
			count: 1,
			gross: { amountMinor: 500, currency: 'EUR' },
			fee: { amountMinor: 45, currency: 'EUR' },
			net: { amountMinor: 455, currency: 'EUR' }
		});
	});

	it('a declined card then a successful retry ends paid; a late decline event changes nothing', async () => {
		const { tip } = await startTip({ currency: 'JPY', amount: '1000' });
		await fetch(`${API()}/pay/${tip.checkoutSessionId}/decline`, { method: 'POST' });
		const { session, intent } = await payAtFake(tip.checkoutSessionId);
		const failed = eventJson('payment_intent.payment_failed', {
			...intent,
			status: 'requires_payment_method'
		});
		const completed = eventJson('checkout.session.completed', session);
		expect(await receiveWebhook(completed, sign(completed), ORIGIN)).toMatchObject({
			outcome: 'applied'
		});
		expect(await receiveWebhook(failed, sign(failed), ORIGIN)).toMatchObject({
			outcome: 'unchanged'
		});
		await tip.reload();
		expect(tip.status).toBe('paid');
		// Fake tariff: floor((1000 × 29 + 500) / 1000) = 29 yen, no fixed part for JPY. By hand.
		expect(tip.feeMinor).toBe(29);
	});
});

describe('refunds', () => {
	it('round-trips through the provider, updates the ledger and notifies both once', async () => {
		const { tip } = await startTip({ currency: 'JPY', amount: '500' });
		const { session } = await payAtFake(tip.checkoutSessionId);
		const completed = eventJson('checkout.session.completed', session);
		await receiveWebhook(completed, sign(completed), ORIGIN);
		const admin = (await User.findOne({ where: { email: 'admin@slotwise.test' } }))!;

		expect(await refundTip(tip.id, admin.id, ORIGIN)).toEqual({ kind: 'ok', amount: 'JP¥500' }); // CLDR en-GB writes yen as JP¥ (from memory);
		await tip.reload();
		expect(tip.status).toBe('refunded');
		expect(tip.refundedAt).not.toBeNull();
		const intent = await fakeGet(
			`/v1/payment_intents/${tip.paymentIntentId}?expand[]=latest_charge`
		);
		expect(intent.latest_charge).toMatchObject({ refunded: true, amount_refunded: 500 });

		// A second click is refused here; the provider's own charge.refunded event changes nothing.
		expect((await refundTip(tip.id, admin.id, ORIGIN)).kind).toBe('conflict');
		const refunded = eventJson('charge.refunded', intent.latest_charge);
		expect(await receiveWebhook(refunded, sign(refunded), ORIGIN)).toMatchObject({
			outcome: 'unchanged'
		});
		// A late "paid" after the refund does not bring the money back.
		expect(await receiveWebhook(completed, sign(completed), ORIGIN)).toEqual({
			kind: 'duplicate',
			eventId: JSON.parse(completed).id
		});
		await tip.reload();
		expect(tip.status).toBe('refunded');

		await settled();
		await drainMailQueue();
		await waitForMessage({ to: reader.email, subject: /was refunded/ });
		await waitForMessage({ to: author.email, subject: /was refunded/ });
		await new Promise((resolve) => setTimeout(resolve, 500));
		const refundMails = (await listMessages()).filter((m) => /was refunded/.test(m.subject));
		expect(refundMails.filter((m) => m.to.includes(reader.email))).toHaveLength(1);
		expect(refundMails.filter((m) => m.to.includes(author.email))).toHaveLength(1);

		const summary = await earnings(author.id);
		expect(summary.totals).toEqual([]);
		expect(summary.refundedCount).toBe(1);
		const csv = await earningsCsv(author.id);
		expect(csv.trim().split('\n')[1]).toMatch(/,JPY,500,15,refunded$/);
	});
});

describe('the ledger', () => {
	it('keeps currencies apart in the totals', async () => {
		const tipsToPay: Record<string, string>[] = [
			{ currency: 'JPY', amount: '500' },
			{ currency: 'EUR', amount: 'custom', customAmount: '7.50' }
		];
		for (const fields of tipsToPay) {
			const { tip } = await startTip(fields);
			const { session } = await payAtFake(tip.checkoutSessionId);
			const completed = eventJson('checkout.session.completed', session);
			await receiveWebhook(completed, sign(completed), ORIGIN);
		}
		const { totals } = await earnings(author.id);
		// Fake tariff by hand: JPY 500 → floor(15000/1000) = 15 → net 485;
		// EUR 750 → floor(22250/1000) = 22, + 30 = 52 → net 698.
		expect(
			totals.map((t) => [t.currency, t.gross.amountMinor, t.fee.amountMinor, t.net.amountMinor])
		).toEqual([
			['EUR', 750, 52, 698],
			['JPY', 500, 15, 485]
		]);
	});
});
