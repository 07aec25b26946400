/**
 * The newsletter from the account page (issue 17): a signed-in user's subscription, found by
 * account or else by their address. A verified account address needs no second opt-in. The
 * public double opt-in, signed links and preferences live in subscribers.ts.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { NewsletterPreferences } from '$lib/schemas/newsletter';
import type { Issues, Outcome } from '$lib/schemas/issues';
import { Subscriber, User, sequelize } from '$lib/server/db';
import type { SubscriberStatus } from '$lib/server/db/models/Subscriber';
import { pokeInlineWorker } from '$lib/server/mail/queue/inline';
import { queueConfirmation, storedPreferences, viewOf } from './subscribers';
import type { SubscriptionView } from './subscribers';

/** The signed-in user's subscription (by account, else by their address), or null. */
async function accountSubscriber(
	userId: string,
	transaction?: Transaction
): Promise<{ user: User; subscriber: Subscriber | null } | null> {
	const user = await User.findByPk(userId, { transaction });
	if (!user) return null;
	const subscriber = await Subscriber.findOne({
		where: { [Op.or]: [{ userId }, { email: user.email }] },
		order: [['userId', 'DESC']],
		transaction,
		...(transaction ? { lock: transaction.LOCK.UPDATE } : {})
	});
	return { user, subscriber };
}

export async function accountSubscription(userId: string): Promise<SubscriptionView | null> {
	const found = await accountSubscriber(userId);
	return found?.subscriber ? viewOf(found.subscriber) : null;
}

export type AccountSubscribeOutcome =
	| { kind: 'ok'; status: SubscriberStatus }
	| { kind: 'invalid'; issues: Issues }
	| { kind: 'not_found' };

/**
 * Subscribes or updates from the account page. A verified account address needs no second
 * opt-in; an unverified one gets the confirmation link like anyone else.
 */
export async function subscribeAccount(
	userId: string,
	input: NewsletterPreferences,
	origin: string
): Promise<AccountSubscribeOutcome> {
	const outcome = await sequelize.transaction(
		async (transaction): Promise<AccountSubscribeOutcome> => {
			const found = await accountSubscriber(userId, transaction);
			if (!found) return { kind: 'not_found' };
			const { user } = found;
			const prefs = await storedPreferences(input, transaction);
			if (!prefs.ok) return { kind: 'invalid', issues: prefs.issues };
			const verified = user.emailVerified !== null;
			let s = found.subscriber;
			if (!s) {
				s = await Subscriber.create(
					{ email: user.email, userId, status: 'pending', ...prefs.values },
					{ transaction }
				);
			} else {
				await s.update({ ...prefs.values, userId }, { transaction });
			}
			if (s.status !== 'confirmed') {
				if (verified) {
					await s.update(
						{
							status: 'confirmed',
							confirmedAt: new Date(),
							confirmTokenHash: null,
							unsubscribedAt: null,
							suppressedAt: null,
							suppressedReason: null
						},
						{ transaction }
					);
				} else {
					await queueConfirmation(s, origin, transaction);
				}
			}
			return { kind: 'ok', status: s.status };
		}
	);
	pokeInlineWorker();
	return outcome;
}

export async function unsubscribeAccount(userId: string): Promise<Outcome> {
	return sequelize.transaction(async (transaction) => {
		const found = await accountSubscriber(userId, transaction);
		if (!found?.subscriber) return { kind: 'not_found' };
		if (found.subscriber.status !== 'unsubscribed')
			await found.subscriber.update(
				{ status: 'unsubscribed', unsubscribedAt: new Date() },
				{ transaction }
			);
		return { kind: 'ok' };
	});
}
