/**
 * The tip ledger's changes after checkout (issue 20): the provider's webhooks and an admin's
 * refund. The only module that moves a tip's status.
 *
 * Webhooks: the signature is checked with the SDK (raw body, 5-minute tolerance); each event
 * id is stored in payment_events in the same transaction as the change it caused, so a
 * redelivered or replayed event changes nothing. Statuses only move forward
 * (domain/tips.ts statusesBefore) with a conditional UPDATE, so two events saying "paid"
 * (checkout.session.completed and payment_intent.succeeded), in any order or at once, mark
 * the row paid once and send one receipt. Events for checkout sessions that are not in our
 * ledger (another installation sharing a test account) are acknowledged and left alone.
 *
 * Nothing here logs a request body, a signature header or the provider's key: only event
 * ids, types and outcomes.
 */
import { QueryTypes, UniqueConstraintError } from 'sequelize';
import type Stripe from 'stripe';
import { formatMoney, money } from '$lib/domain/money';
import { statusesBefore, type TipStatus } from '$lib/domain/tips';
import { PaymentEvent, Tip, sequelize } from '$lib/server/db';
import type { PaymentEventOutcome } from '$lib/server/db/models/PaymentEvent';
import { provider, webhookSecret, WEBHOOK_TOLERANCE_SECONDS } from '$lib/server/payments/provider';
import * as audit from './audit';
import { mailTipChange } from './tip-mail';

export type WebhookResult =
	| { kind: 'refused'; reason: 'unsigned' | 'bad_signature' | 'stale' | 'malformed' }
	| { kind: 'duplicate'; eventId: string }
	| { kind: 'accepted'; eventId: string; outcome: PaymentEventOutcome; tipId: number | null };

function logLine(kind: string, detail: Record<string, unknown>): void {
	console.log(JSON.stringify({ t: new Date().toISOString(), kind, ...detail }));
}

interface Effect {
	to: TipStatus;
	sessionId: string | null;
	paymentIntentId: string | null;
}

const idOf = (value: unknown): string | null =>
	typeof value === 'string'
		? value
		: value && typeof value === 'object' && 'id' in value
			? String(value.id)
			: null;

/** What an event means for the ledger, or null for types we do not use. */
function effectOf(event: Stripe.Event): Effect | null {
	const object = event.data.object as unknown as Record<string, unknown>;
	switch (event.type) {
		case 'checkout.session.completed':
		case 'checkout.session.async_payment_succeeded':
			if (object.payment_status !== 'paid') return null;
			return {
				to: 'paid',
				sessionId: String(object.id),
				paymentIntentId: idOf(object.payment_intent)
			};
		case 'checkout.session.async_payment_failed':
		case 'checkout.session.expired':
			return {
				to: 'failed',
				sessionId: String(object.id),
				paymentIntentId: idOf(object.payment_intent)
			};
		case 'payment_intent.succeeded':
			return { to: 'paid', sessionId: null, paymentIntentId: String(object.id) };
		case 'payment_intent.payment_failed':
			return { to: 'failed', sessionId: null, paymentIntentId: String(object.id) };
		case 'charge.refunded':
			// A partial refund is not something Slotwise makes; only a full one changes the row.
			if (object.refunded !== true) return null;
			return { to: 'refunded', sessionId: null, paymentIntentId: idOf(object.payment_intent) };
		default:
			return null;
	}
}

/** Our ledger row for the event: by session id, else by payment intent, else ask the provider. */
async function findTip(effect: Effect): Promise<Tip | null> {
	if (effect.sessionId) return Tip.findOne({ where: { checkoutSessionId: effect.sessionId } });
	if (!effect.paymentIntentId) return null;
	const known = await Tip.findOne({ where: { paymentIntentId: effect.paymentIntentId } });
	if (known) return known;
	// payment_intent.* can arrive before checkout.session.completed told us the intent's id.
	const sessions = await provider().checkout.sessions.list({
		payment_intent: effect.paymentIntentId,
		limit: 1
	});
	const sessionId = sessions.data[0]?.id;
	return sessionId ? Tip.findOne({ where: { checkoutSessionId: sessionId } }) : null;
}

/** The provider's fee for a paid intent, when it is in the tip's currency. */
async function feeOf(paymentIntentId: string, currency: string): Promise<number | null> {
	const intent = await provider().paymentIntents.retrieve(paymentIntentId, {
		expand: ['latest_charge.balance_transaction']
	});
	const charge = intent.latest_charge as Stripe.Charge | null;
	const txn = charge?.balance_transaction as Stripe.BalanceTransaction | null | undefined;
	if (!txn || typeof txn !== 'object' || txn.currency.toUpperCase() !== currency) return null;
	return Number.isSafeInteger(txn.fee) ? txn.fee : null;
}

const STAMP: Record<TipStatus, string | null> = {
	pending: null,
	failed: 'failed_at',
	paid: 'paid_at',
	refunded: 'refunded_at'
};

/**
 * Moves the tip forward to `to` inside `transaction`; true when this call changed the row
 * (and so owns the mails), false when it was already there or beyond.
 */
async function moveForward(
	tipId: number,
	to: TipStatus,
	details: { paymentIntentId: string | null; feeMinor: number | null },
	transaction: import('sequelize').Transaction
): Promise<boolean> {
	const stamp = STAMP[to];
	const [, affected] = await sequelize.query(
		`UPDATE tips SET status = :to, ${stamp ? `${stamp} = UTC_TIMESTAMP(),` : ''}
		   payment_intent_id = COALESCE(payment_intent_id, :paymentIntentId),
		   fee_minor = COALESCE(:feeMinor, fee_minor), updated_at = UTC_TIMESTAMP()
		 WHERE id = :tipId AND status IN (:from)`,
		{
			replacements: { to, tipId, from: statusesBefore(to), ...details },
			type: QueryTypes.UPDATE,
			transaction
		}
	);
	return affected === 1;
}

/**
 * Verifies and applies one webhook delivery. `rawBody` must be the exact bytes received (the
 * signature covers them); `origin` builds the links in the mails.
 */
export async function receiveWebhook(
	rawBody: string,
	signatureHeader: string | null,
	origin: string
): Promise<WebhookResult> {
	if (!signatureHeader) {
		logLine('payment_webhook_refused', { reason: 'unsigned' });
		return { kind: 'refused', reason: 'unsigned' };
	}
	let event: Stripe.Event;
	try {
		event = provider().webhooks.constructEvent(
			rawBody,
			signatureHeader,
			webhookSecret(),
			WEBHOOK_TOLERANCE_SECONDS
		);
	} catch (e) {
		const message = e instanceof Error ? e.message : '';
		const reason = /tolerance/i.test(message)
			? 'stale'
			: /signature|header/i.test(message)
				? 'bad_signature'
				: 'malformed';
		logLine('payment_webhook_refused', { reason });
		return { kind: 'refused', reason };
	}
	const effect = effectOf(event);
	const tip = effect ? await findTip(effect) : null;
	// Network calls happen before the transaction, so no row lock waits on the provider.
	const paymentIntentId = effect?.paymentIntentId ?? null;
	const feeMinor =
		tip &&
		effect?.to === 'paid' &&
		paymentIntentId &&
		(tip.status === 'pending' || tip.status === 'failed')
			? await feeOf(paymentIntentId, tip.currency)
			: null;
	// An object, so the transaction's callback can change it without TypeScript narrowing it away.
	const result: { outcome: PaymentEventOutcome } = {
		outcome: !effect ? 'ignored' : !tip ? 'unknown' : 'unchanged'
	};
	try {
		await sequelize.transaction(async (transaction) => {
			if (
				effect &&
				tip &&
				(await moveForward(tip.id, effect.to, { paymentIntentId, feeMinor }, transaction))
			)
				result.outcome = 'applied';
			await PaymentEvent.create(
				{
					eventId: event.id,
					type: event.type,
					tipId: tip?.id ?? null,
					outcome: result.outcome,
					receivedAt: new Date()
				},
				{ transaction }
			);
		});
	} catch (e) {
		if (e instanceof UniqueConstraintError) {
			logLine('payment_webhook_duplicate', { eventId: event.id, type: event.type });
			return { kind: 'duplicate', eventId: event.id };
		}
		throw e;
	}
	logLine('payment_webhook', {
		eventId: event.id,
		type: event.type,
		outcome: result.outcome,
		tipId: tip?.id ?? null
	});
	if (result.outcome === 'applied' && tip && effect) mailTipChange(tip.id, effect.to, origin);
	return { kind: 'accepted', eventId: event.id, outcome: result.outcome, tipId: tip?.id ?? null };
}

export type RefundResult =
	| { kind: 'ok'; amount: string }
	| { kind: 'not_found' }
	| { kind: 'conflict'; message: string }
	| { kind: 'provider_error'; message: string };

/**
 * An admin refunds a paid tip in full through the provider. The ledger changes here at once
 * (the provider's charge.refunded webhook that follows then finds it done); the refund
 * carries an idempotency key per payment, so a double click cannot refund twice.
 */
export async function refundTip(
	tipId: number,
	adminId: string,
	origin: string
): Promise<RefundResult> {
	const tip = await Tip.findByPk(tipId);
	if (!tip) return { kind: 'not_found' };
	if (tip.status !== 'paid' || !tip.paymentIntentId)
		return {
			kind: 'conflict',
			message: `Only a paid tip can be refunded; this one is ${tip.status}.`
		};
	try {
		await provider().refunds.create(
			{ payment_intent: tip.paymentIntentId, reason: 'requested_by_customer' },
			// Keyed by the payment, not our row id: row ids repeat across databases sharing an
			// account (a restored backup, a test database), payment ids never do.
			{ idempotencyKey: `slotwise-refund-${tip.paymentIntentId}` }
		);
	} catch (e) {
		// The SDK's message only (e.g. "Charge has already been refunded"), never the request.
		const message = e instanceof Error ? e.message : 'The payment provider refused the refund.';
		logLine('payment_refund_failed', { tipId: tip.id, message });
		return { kind: 'provider_error', message };
	}
	const moved = await sequelize.transaction(async (transaction) => {
		// The provider's charge.refunded webhook may have moved the row already; the admin's
		// act is recorded either way.
		const changed = await moveForward(
			tip.id,
			'refunded',
			{ paymentIntentId: null, feeMinor: null },
			transaction
		);
		await audit.record(
			{
				actorId: adminId,
				action: 'tip.refund',
				subjectType: 'tip',
				subjectId: String(tip.id),
				before: { status: 'paid' },
				after: { status: 'refunded' }
			},
			transaction
		);
		return changed;
	});
	if (moved) mailTipChange(tip.id, 'refunded', origin);
	return { kind: 'ok', amount: formatMoney(money(tip.amountMinor, tip.currency)) };
}
