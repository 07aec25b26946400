/**
 * Newsletter subscribers: double opt-in, preferences behind a signed link or the account
 * page, one-click unsubscribe. The only module that writes subscribers (the mail worker
 * suppresses an address the server refuses for good).
 *
 * Nothing here reveals whether an address is subscribed: subscribing answers the same for
 * every address, and the mailbox gets what fits (a confirmation link, or a note with a
 * manage link for an address already on the list). Mail is queued in the same transaction
 * as the change it belongs to (server/mail/queue) and sent off the request path.
 */
import { Op, UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import { minorUnitDigits } from '$lib/domain/money';
import type { NewsletterPreferences, SubscribeInput } from '$lib/schemas/newsletter';
import { Region, Subscriber, User, sequelize } from '$lib/server/db';
import type { SubscriberAudience, SubscriberStatus } from '$lib/server/db/models/Subscriber';
import * as letters from '$lib/server/mail/newsletter-templates';
import { enqueueMessage } from '$lib/server/mail/queue';
import { pokeInlineWorker } from '$lib/server/mail/queue/inline';
import {
	CONFIRM_LINK_HOURS,
	checkLink,
	issueLink,
	linkUrl,
	tokenHash,
	type LinkPurpose
} from '$lib/server/newsletter/links';
import type { Issues } from '$lib/schemas/issues';

export interface PreferencesView {
	homeRegion: string;
	/** The home region's currency: budgets are whole amounts of it. */
	currency: string;
	regions: string[];
	budgetMin: number | null;
	budgetMax: number | null;
	tags: string[];
	audience: SubscriberAudience;
}

export interface SubscriptionView {
	email: string;
	status: SubscriberStatus;
	preferences: PreferencesView;
	/** Linked to an account, so "authors I follow" can work. */
	canFollow: boolean;
	confirmedAt: string | null;
}

export type LinkProblem = 'malformed' | 'forged' | 'expired' | 'used';

const DEFAULT_PREFERENCES = { regions: [], tags: [], audience: 'filters' } as const;

async function regionByCode(code: string, transaction?: Transaction) {
	return Region.findOne({ where: { code }, transaction });
}

/** Preferences as stored, or field issues when a region is unknown. */
export async function storedPreferences(
	p: NewsletterPreferences,
	transaction?: Transaction
): Promise<
	| { ok: true; values: Partial<Subscriber> & { homeRegionId: number } }
	| { ok: false; issues: Issues }
> {
	const home = await regionByCode(p.homeRegion, transaction);
	if (!home) return { ok: false, issues: { homeRegion: ['Choose a region from the list.'] } };
	const known = new Set(
		(await Region.findAll({ attributes: ['code'], transaction })).map((r) => r.code)
	);
	if (p.regions.some((r) => !known.has(r)))
		return { ok: false, issues: { regions: ['Choose regions from the list.'] } };
	const scale = 10 ** minorUnitDigits(home.currency);
	return {
		ok: true,
		values: {
			homeRegionId: home.id,
			regions: [...new Set(p.regions)],
			tags: [...new Set(p.tags)],
			budgetMinMinor: p.budgetMin === null ? null : p.budgetMin * scale,
			budgetMaxMinor: p.budgetMax === null ? null : p.budgetMax * scale,
			audience: p.audience
		}
	};
}

export async function viewOf(s: Subscriber, transaction?: Transaction): Promise<SubscriptionView> {
	const home = await Region.findByPk(s.homeRegionId, { transaction });
	const currency = home?.currency ?? 'EUR';
	const scale = 10 ** minorUnitDigits(currency);
	return {
		email: s.email,
		status: s.status,
		preferences: {
			homeRegion: home?.code ?? '',
			currency,
			regions: s.regions ?? [],
			budgetMin: s.budgetMinMinor === null ? null : Math.round(s.budgetMinMinor / scale),
			budgetMax: s.budgetMaxMinor === null ? null : Math.round(s.budgetMaxMinor / scale),
			tags: s.tags ?? [],
			audience: s.audience
		},
		canFollow: s.userId !== null,
		confirmedAt: s.confirmedAt?.toISOString() ?? null
	};
}

/** A fresh manage link (90 days) for one subscriber. */
export function manageUrl(s: Pick<Subscriber, 'id' | 'linkVersion'>, origin: string): string {
	return linkUrl(origin, '/newsletter/manage', issueLink('manage', s.id, s.linkVersion).token);
}

/** A fresh confirmation link: its hash replaces the stored one, so older links stop working. */
export async function queueConfirmation(s: Subscriber, origin: string, transaction: Transaction) {
	const link = issueLink('confirm', s.id, s.linkVersion);
	await s.update({ confirmTokenHash: link.hash, confirmSentAt: new Date() }, { transaction });
	await enqueueMessage(
		{
			to: s.email,
			subscriberId: s.id,
			message: letters.confirmSubscription({
				url: linkUrl(origin, '/newsletter/confirm', link.token),
				hours: CONFIRM_LINK_HOURS
			})
		},
		transaction
	);
}

/**
 * Subscribe from the footer or the newsletter page. The answer is the same for every
 * address. A new address (or one that left) gets a confirmation link and is mailed nothing
 * else until it is followed; a confirmed one keeps its preferences and gets a note with a
 * manage link, so nobody can change another person's choices by typing their address.
 */
export async function subscribe(
	input: SubscribeInput,
	origin: string
): Promise<{ kind: 'ok' } | { kind: 'invalid'; issues: Issues }> {
	const attempt = () =>
		sequelize.transaction(async (transaction) => {
			const prefs = await storedPreferences(input, transaction);
			if (!prefs.ok) return { kind: 'invalid', issues: prefs.issues } as const;
			const existing = await Subscriber.findOne({
				where: { email: input.email },
				lock: transaction.LOCK.UPDATE,
				transaction
			});
			if (existing?.status === 'confirmed') {
				await enqueueMessage(
					{
						to: existing.email,
						subscriberId: existing.id,
						message: letters.alreadySubscribed({ manageUrl: manageUrl(existing, origin) })
					},
					transaction
				);
				return { kind: 'ok' } as const;
			}
			const subscriber = existing
				? await existing.update(prefs.values, { transaction })
				: await Subscriber.create(
						{ email: input.email, status: 'pending', ...prefs.values },
						{ transaction }
					);
			await queueConfirmation(subscriber, origin, transaction);
			return { kind: 'ok' } as const;
		});
	let outcome;
	try {
		outcome = await attempt();
	} catch (error) {
		// Two first subscriptions of one address at once: the loser finds the winner's row.
		if (!(error instanceof UniqueConstraintError)) throw error;
		outcome = await attempt();
	}
	pokeInlineWorker();
	return outcome;
}

export type TokenOutcome<T extends object = object> =
	({ kind: 'ok' } & T) | { kind: 'invalid'; problem: LinkProblem };

/** A link's subscriber, locked when a transaction is given, or why the link does not work. */
async function subscriberFor(
	purpose: LinkPurpose,
	token: string | null,
	transaction?: Transaction
): Promise<{ ok: true; subscriber: Subscriber } | { ok: false; problem: LinkProblem }> {
	const check = checkLink(purpose, token);
	if (!check.ok) return { ok: false, problem: check.reason };
	const subscriber = await Subscriber.findByPk(check.subscriberId, {
		transaction,
		...(transaction ? { lock: transaction.LOCK.UPDATE } : {})
	});
	if (!subscriber) return { ok: false, problem: 'forged' };
	if (purpose === 'confirm') {
		if (subscriber.confirmTokenHash !== tokenHash(token ?? ''))
			return { ok: false, problem: 'used' };
	} else if (subscriber.linkVersion !== check.linkVersion) {
		return { ok: false, problem: 'used' };
	}
	return { ok: true, subscriber };
}

/** For the confirm page's GET: is the link good? Changes nothing. */
export async function checkConfirmLink(token: string | null): Promise<TokenOutcome> {
	const found = await subscriberFor('confirm', token);
	return found.ok ? { kind: 'ok' } : { kind: 'invalid', problem: found.problem };
}

/**
 * Follows the double opt-in link: the subscription starts, the link is spent. An account
 * with the same verified address is linked, so "authors I follow" can work.
 */
export async function confirm(
	token: string | null,
	origin: string
): Promise<TokenOutcome<{ manageUrl: string }>> {
	return sequelize.transaction(async (transaction) => {
		const found = await subscriberFor('confirm', token, transaction);
		if (!found.ok) return { kind: 'invalid', problem: found.problem };
		const s = found.subscriber;
		const account =
			s.userId === null
				? await User.findOne({
						where: { email: s.email, emailVerified: { [Op.ne]: null }, disabledAt: null },
						attributes: ['id'],
						transaction
					})
				: null;
		const taken =
			account && (await Subscriber.count({ where: { userId: account.id }, transaction })) > 0;
		await s.update(
			{
				status: 'confirmed',
				confirmedAt: new Date(),
				confirmTokenHash: null,
				unsubscribedAt: null,
				suppressedAt: null,
				suppressedReason: null,
				...(account && !taken ? { userId: account.id } : {})
			},
			{ transaction }
		);
		return { kind: 'ok', manageUrl: manageUrl(s, origin) };
	});
}

/** The manage page: what the signed link's subscriber chose. */
export async function manageView(
	token: string | null
): Promise<TokenOutcome<{ subscription: SubscriptionView }>> {
	const found = await subscriberFor('manage', token);
	if (!found.ok) return { kind: 'invalid', problem: found.problem };
	return { kind: 'ok', subscription: await viewOf(found.subscriber) };
}

export type SaveOutcome =
	| { kind: 'ok'; subscription: SubscriptionView }
	| { kind: 'invalid'; issues: Issues }
	| { kind: 'link'; problem: LinkProblem };

/** Saves preferences from the manage page; an unsubscribed address that saves is back on the list. */
export async function savePreferences(
	token: string | null,
	input: NewsletterPreferences
): Promise<SaveOutcome> {
	return sequelize.transaction(async (transaction) => {
		const found = await subscriberFor('manage', token, transaction);
		if (!found.ok) return { kind: 'link', problem: found.problem };
		return save(found.subscriber, input, transaction);
	});
}

async function save(
	s: Subscriber,
	input: NewsletterPreferences,
	transaction: Transaction
): Promise<SaveOutcome> {
	const prefs = await storedPreferences(input, transaction);
	if (!prefs.ok) return { kind: 'invalid', issues: prefs.issues };
	// Whoever holds the link (or the account) controls the mailbox: no second opt-in needed.
	const back =
		s.status === 'unsubscribed' ? { status: 'confirmed' as const, unsubscribedAt: null } : {};
	await s.update({ ...prefs.values, ...back }, { transaction });
	return { kind: 'ok', subscription: await viewOf(s, transaction) };
}

/**
 * One-click unsubscribe (RFC 8058) and the manage page's button. Idempotent: a second click
 * finds the address already off the list and changes nothing.
 */
export async function unsubscribe(
	purpose: 'unsubscribe' | 'manage',
	token: string | null
): Promise<TokenOutcome<{ already: boolean }>> {
	return sequelize.transaction(async (transaction) => {
		const found = await subscriberFor(purpose, token, transaction);
		if (!found.ok) return { kind: 'invalid', problem: found.problem };
		const s = found.subscriber;
		if (s.status === 'unsubscribed') return { kind: 'ok', already: true };
		await s.update({ status: 'unsubscribed', unsubscribedAt: new Date() }, { transaction });
		return { kind: 'ok', already: false };
	});
}

/** For the unsubscribe page's GET: is the link good, and is the address still on the list? */
export async function unsubscribeView(
	token: string | null
): Promise<TokenOutcome<{ subscribed: boolean }>> {
	const found = await subscriberFor('unsubscribe', token);
	if (!found.ok) return { kind: 'invalid', problem: found.problem };
	return { kind: 'ok', subscribed: found.subscriber.status !== 'unsubscribed' };
}

/**
 * Mails a fresh manage link to a subscribed address; answers the same whether or not the
 * address is on the list (nothing is sent for an unknown one).
 */
export async function requestManageLink(email: string, origin: string): Promise<{ kind: 'ok' }> {
	await sequelize.transaction(async (transaction) => {
		const s = await Subscriber.findOne({ where: { email }, transaction });
		if (!s || s.status === 'pending') return;
		await enqueueMessage(
			{
				to: s.email,
				subscriberId: s.id,
				message: letters.manageLink({ manageUrl: manageUrl(s, origin) })
			},
			transaction
		);
	});
	pokeInlineWorker();
	return { kind: 'ok' };
}

/** Regions and tags the preference forms offer. */
export async function preferenceChoices(): Promise<{
	regions: { code: string; name: string; currency: string }[];
}> {
	const regions = await Region.findAll({ order: [['name', 'ASC']] });
	return { regions: regions.map((r) => ({ code: r.code, name: r.name, currency: r.currency })) };
}

export { DEFAULT_PREFERENCES };
