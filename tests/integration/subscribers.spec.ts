import { beforeEach, describe, expect, it } from 'vitest';
import { subscribeInput } from '../../src/lib/schemas/newsletter';
import { MailJob, Region, Subscriber, User } from '../../src/lib/server/db';
import { issueLink } from '../../src/lib/server/newsletter/links';
import * as subscribers from '../../src/lib/server/services/subscribers';
import * as subscriberAccounts from '../../src/lib/server/services/subscriber-accounts';
import { resetDatabase } from '../support/db';
import { drainMailQueue } from '../support/mail-queue';
import { firstLink, listMessages, waitForMessage } from '../support/mailbox';

/*
 * Subscribing with double opt-in, signed links, and the account panel, on the real MariaDB
 * and through the shared SMTP fake. Fresh addresses per run.
 */

const ORIGIN = 'http://127.0.0.1:4173';
const run = `${Date.now()}`;
const address = (label: string) => `${label}-${run}@example.test`;

beforeEach(async () => {
	await resetDatabase();
	await Region.create({
		code: 'de',
		name: 'Germany',
		currency: 'EUR',
		taxMode: 'inclusive',
		taxRateBp: 1900
	});
	await Region.create({
		code: 'jp',
		name: 'Japan',
		currency: 'JPY',
		taxMode: 'inclusive',
		taxRateBp: 1000
	});
});

function input(email: string, extra: Record<string, unknown> = {}) {
	return subscribeInput.parse({ email, homeRegion: 'de', ...extra });
}

function tokenOf(link: string): string {
	return new URL(link).searchParams.get('token') ?? '';
}

describe('subscribing', () => {
	it('a new address gets one confirmation link; nothing else until it is followed', async () => {
		const email = address('new');
		expect(await subscribers.subscribe(input(email, { tags: ['quiet'] }), ORIGIN)).toEqual({
			kind: 'ok'
		});
		const row = (await Subscriber.findOne({ where: { email } }))!;
		expect(row.status).toBe('pending');
		expect(row.tags).toEqual(['quiet']);
		// Only a SHA-256 of the link's token is stored.
		expect(row.confirmTokenHash).toMatch(/^[0-9a-f]{64}$/);
		await drainMailQueue();
		const mail = await waitForMessage({ to: email, subject: /^Confirm your Slotwise newsletter/ });
		const token = tokenOf(firstLink(mail, '/newsletter/confirm'));
		expect(row.confirmTokenHash).not.toContain(token);
		const confirmed = await subscribers.confirm(token, ORIGIN);
		expect(confirmed.kind).toBe('ok');
		await row.reload();
		expect(row.status).toBe('confirmed');
		expect(row.confirmTokenHash).toBeNull();
		// The link is spent.
		expect(await subscribers.confirm(token, ORIGIN)).toEqual({ kind: 'invalid', problem: 'used' });
	});

	it('subscribing twice answers the same and keeps one row; the newer link replaces the older', async () => {
		const email = address('twice');
		await subscribers.subscribe(input(email), ORIGIN);
		await drainMailQueue();
		const first = tokenOf(firstLink(await waitForMessage({ to: email }), '/newsletter/confirm'));
		expect(await subscribers.subscribe(input(email, { tags: ['gaming'] }), ORIGIN)).toEqual({
			kind: 'ok'
		});
		await drainMailQueue();
		expect(await Subscriber.count({ where: { email } })).toBe(1);
		const mails = (await listMessages()).filter((m) => m.to.includes(email));
		expect(mails).toHaveLength(2);
		const second = tokenOf(firstLink(mails[0]!, '/newsletter/confirm'));
		expect(await subscribers.confirm(first, ORIGIN)).toEqual({ kind: 'invalid', problem: 'used' });
		expect((await subscribers.confirm(second, ORIGIN)).kind).toBe('ok');
	});

	it('a confirmed address keeps its choices and gets a note with a manage link, not a second subscription', async () => {
		const email = address('existing');
		const de = (await Region.findOne({ where: { code: 'de' } }))!;
		await Subscriber.create({ email, homeRegionId: de.id, status: 'confirmed', tags: ['quiet'] });
		expect(await subscribers.subscribe(input(email, { tags: ['gaming'] }), ORIGIN)).toEqual({
			kind: 'ok'
		});
		await drainMailQueue();
		const row = (await Subscriber.findOne({ where: { email } }))!;
		expect(row.tags).toEqual(['quiet']);
		expect(row.confirmTokenHash).toBeNull();
		const mail = await waitForMessage({ to: email });
		expect(mail.subject).toBe('You already get the Slotwise newsletter');
		const manage = await subscribers.manageView(tokenOf(firstLink(mail, '/newsletter/manage')));
		expect(manage.kind).toBe('ok');
	});

	it('refuses header-injecting and malformed addresses before anything is stored', async () => {
		for (const bad of [
			'a@example.test\r\nBcc: victim@example.test',
			'"a@evil.test"@example.test',
			'a@example.test, b@example.test',
			'no-at-sign'
		]) {
			expect(subscribeInput.safeParse({ email: bad, homeRegion: 'de' }).success, bad).toBe(false);
		}
		expect(await Subscriber.count()).toBe(0);
		expect(await MailJob.count()).toBe(0);
	});

	it('an unknown home region is a field error and stores nothing', async () => {
		const outcome = await subscribers.subscribe(
			input(address('nowhere'), { homeRegion: 'zz' }),
			ORIGIN
		);
		expect(outcome).toEqual({
			kind: 'invalid',
			issues: { homeRegion: ['Choose a region from the list.'] }
		});
		expect(await Subscriber.count()).toBe(0);
	});

	it('keeps budgets in minor units of the home currency: €1,200 → 120000, ¥150,000 → 150000', async () => {
		// ISO 4217 minor units (docs/sources.md 10a): EUR 2 digits, JPY 0 digits.
		await subscribers.subscribe(
			input(address('eur'), { budgetMin: '800', budgetMax: '1200' }),
			ORIGIN
		);
		await subscribers.subscribe(
			input(address('jpy'), { homeRegion: 'jp', budgetMax: '150000' }),
			ORIGIN
		);
		const eur = (await Subscriber.findOne({ where: { email: address('eur') } }))!;
		const jpy = (await Subscriber.findOne({ where: { email: address('jpy') } }))!;
		expect([eur.budgetMinMinor, eur.budgetMaxMinor]).toEqual([80000, 120000]);
		expect([jpy.budgetMinMinor, jpy.budgetMaxMinor]).toEqual([null, 150000]);
	});
});

describe('links', () => {
	async function confirmed(label: string) {
		const de = (await Region.findOne({ where: { code: 'de' } }))!;
		return Subscriber.create({ email: address(label), homeRegionId: de.id, status: 'confirmed' });
	}

	it('one-click unsubscribe works once and again harmlessly; a revoked version stops working', async () => {
		const s = await confirmed('unsub');
		const { token } = issueLink('unsubscribe', s.id, s.linkVersion);
		expect(await subscribers.unsubscribeView(token)).toEqual({ kind: 'ok', subscribed: true });
		expect(await subscribers.unsubscribe('unsubscribe', token)).toEqual({
			kind: 'ok',
			already: false
		});
		expect(await subscribers.unsubscribe('unsubscribe', token)).toEqual({
			kind: 'ok',
			already: true
		});
		await s.reload();
		expect(s.status).toBe('unsubscribed');
		await s.update({ linkVersion: s.linkVersion + 1 });
		expect(await subscribers.unsubscribe('unsubscribe', token)).toEqual({
			kind: 'invalid',
			problem: 'used'
		});
	});

	it('a forged or expired link is refused and changes nothing', async () => {
		const s = await confirmed('forged');
		const good = issueLink('unsubscribe', s.id, s.linkVersion).token;
		const forged = good.slice(0, -2) + (good.endsWith('AA') ? 'BB' : 'AA');
		expect(await subscribers.unsubscribe('unsubscribe', forged)).toEqual({
			kind: 'invalid',
			problem: 'forged'
		});
		const old = issueLink(
			'unsubscribe',
			s.id,
			s.linkVersion,
			new Date('2026-01-01T00:00:00Z')
		).token;
		expect(await subscribers.unsubscribe('unsubscribe', old)).toEqual({
			kind: 'invalid',
			problem: 'expired'
		});
		expect(await subscribers.unsubscribe('unsubscribe', 'nonsense')).toEqual({
			kind: 'invalid',
			problem: 'malformed'
		});
		await s.reload();
		expect(s.status).toBe('confirmed');
	});

	it('the manage link saves preferences, and saving brings an unsubscribed address back', async () => {
		const s = await confirmed('manage');
		await s.update({ status: 'unsubscribed', unsubscribedAt: new Date() });
		const { token } = issueLink('manage', s.id, s.linkVersion);
		const saved = await subscribers.savePreferences(token, {
			homeRegion: 'jp',
			regions: ['de'],
			budgetMin: null,
			budgetMax: 200000,
			tags: ['1440p'],
			audience: 'both'
		});
		expect(saved.kind).toBe('ok');
		await s.reload();
		expect(s.status).toBe('confirmed');
		expect(s.regions).toEqual(['de']);
		expect(s.budgetMaxMinor).toBe(200000);
	});

	it('asking for a manage link answers the same for unknown addresses and mails only subscribers', async () => {
		const s = await confirmed('relink');
		expect(await subscribers.requestManageLink(s.email, ORIGIN)).toEqual({ kind: 'ok' });
		expect(await subscribers.requestManageLink(address('unknown'), ORIGIN)).toEqual({ kind: 'ok' });
		await drainMailQueue();
		expect((await waitForMessage({ to: s.email })).subject).toBe(
			'Your link to manage the Slotwise newsletter'
		);
		expect((await listMessages()).some((m) => m.to.includes(address('unknown')))).toBe(false);
	});
});

describe('the account panel', () => {
	const prefs = {
		homeRegion: 'de',
		regions: [],
		budgetMin: null,
		budgetMax: null,
		tags: [],
		audience: 'follows' as const
	};

	it('a verified account subscribes at once, linked for "authors I follow"', async () => {
		const user = await User.create({
			email: address('verified'),
			name: 'V',
			role: 'reader',
			emailVerified: new Date()
		});
		expect(await subscriberAccounts.subscribeAccount(user.id, prefs, ORIGIN)).toEqual({
			kind: 'ok',
			status: 'confirmed'
		});
		const view = (await subscriberAccounts.accountSubscription(user.id))!;
		expect(view).toMatchObject({ status: 'confirmed', canFollow: true });
		expect(view.preferences.audience).toBe('follows');
		expect(await subscriberAccounts.unsubscribeAccount(user.id)).toEqual({ kind: 'ok' });
		expect((await subscriberAccounts.accountSubscription(user.id))!.status).toBe('unsubscribed');
	});

	it('an unverified account address gets the confirmation link like anyone else', async () => {
		const user = await User.create({ email: address('unverified'), name: 'U', role: 'reader' });
		expect(await subscriberAccounts.subscribeAccount(user.id, prefs, ORIGIN)).toEqual({
			kind: 'ok',
			status: 'pending'
		});
		await drainMailQueue();
		expect((await waitForMessage({ to: user.email })).subject).toBe(
			'Confirm your Slotwise newsletter subscription'
		);
	});

	it('confirming from the footer links the subscription to the verified account with that address', async () => {
		const user = await User.create({
			email: address('linked'),
			name: 'L',
			role: 'reader',
			emailVerified: new Date()
		});
		await subscribers.subscribe(input(user.email), ORIGIN);
		const row = (await Subscriber.findOne({ where: { email: user.email } }))!;
		const link = issueLink('confirm', row.id, row.linkVersion);
		await row.update({ confirmTokenHash: link.hash });
		expect((await subscribers.confirm(link.token, ORIGIN)).kind).toBe('ok');
		await row.reload();
		expect(row.userId).toBe(user.id);
	});
});
