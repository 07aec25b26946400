/*
 * The newsletter's e-mails, in the layout of templates.ts: the double opt-in link, the note
 * an existing subscriber gets instead of a second subscription, a fresh manage link, a
 * mailing about a guide, and a notice by e-mail. Pure, relative imports only: the mail
 * queue's worker renders mailings with this file outside Vite.
 *
 * Subjects are fixed wording except a mailing's, which an editor writes (the mailer makes
 * it one line). Editors' intros and guide text go in the body, escaped for HTML by render().
 */
import { render, type MailTemplate } from './templates.js';

export function confirmSubscription({ url, hours }: { url: string; hours: number }): MailTemplate {
	return render({
		subject: 'Confirm your Slotwise newsletter subscription',
		greeting: 'Hello,',
		before: [
			`Someone asked to get new Slotwise build guides by e-mail at this address. Confirm within ${hours} hours and the newsletter starts; until then we send nothing else.`
		],
		actions: [{ label: 'Confirm my subscription', url }],
		why: 'You got this e-mail because this address was entered on the Slotwise newsletter form. If it was not you, ignore it: without the confirmation you stay off the list.'
	});
}

/** Sent instead of a second subscription, so the form answers the same for every address. */
export function alreadySubscribed({ manageUrl }: { manageUrl: string }): MailTemplate {
	return render({
		subject: 'You already get the Slotwise newsletter',
		greeting: 'Hello,',
		before: [
			'Someone entered this address on the Slotwise newsletter form, but it is already subscribed. Nothing has changed.',
			'To change which guides you hear about, or to stop the newsletter, use the link below.'
		],
		actions: [{ label: 'Manage my newsletter', url: manageUrl }],
		why: 'You got this e-mail because this address is subscribed to the Slotwise newsletter and was entered on its form again.'
	});
}

/** A manage link asked for from the newsletter page (for example after an old link expired). */
export function manageLink({ manageUrl }: { manageUrl: string }): MailTemplate {
	return render({
		subject: 'Your link to manage the Slotwise newsletter',
		greeting: 'Hello,',
		before: [
			'Here is a fresh link to change your newsletter preferences or to unsubscribe. It works for 90 days.'
		],
		actions: [{ label: 'Manage my newsletter', url: manageUrl }],
		why: 'You got this e-mail because someone asked for a newsletter link for this address on Slotwise. If it was not you, ignore it: nothing changes.'
	});
}

export interface MailingPrice {
	regionName: string;
	/** The picks' total in the recipient's region and currency, formatted; null when a pick is unpriced there. */
	totalText: string | null;
	quoted: number;
	estimated: number;
	unpriced: number;
}

export interface MailingContent {
	subject: string;
	intro: string;
	guide: { title: string; authorName: string; summary: string; url: string };
	price: MailingPrice;
	manageUrl: string;
	unsubscribeUrl: string;
}

function slots(n: number): string {
	return n === 1 ? '1 slot' : `${n} slots`;
}

export function priceSentence(price: MailingPrice): string {
	if (price.totalText === null)
		return `We cannot price every pick in ${price.regionName} yet (${slots(price.unpriced)} without a price there); the guide shows the prices we have.`;
	const how =
		price.estimated === 0
			? 'every pick quoted by a store there'
			: price.quoted === 0
				? 'estimated from the base region’s prices'
				: `${slots(price.quoted)} quoted by stores there, ${slots(price.estimated)} estimated from the base region’s prices`;
	return `In ${price.regionName} the picks come to ${price.totalText} (${how}).`;
}

/** One recipient's copy of a mailing: the editor's intro, the guide and its total in their region. */
export function newsletterMailing(c: MailingContent): MailTemplate {
	const intro = c.intro
		.split(/\r?\n\s*\r?\n/)
		.map((p) => p.trim())
		.filter(Boolean);
	return render({
		subject: c.subject,
		greeting: 'Hello,',
		before: [
			...intro,
			`${c.guide.title}, by ${c.guide.authorName}`,
			c.guide.summary,
			priceSentence(c.price)
		],
		actions: [{ label: 'Read the guide', url: c.guide.url }],
		after: [
			`Change what you get: ${c.manageUrl}`,
			`Unsubscribe with one click: ${c.unsubscribeUrl}`
		],
		why: 'You got this e-mail because you subscribed to the Slotwise newsletter with this address, and this guide matches the preferences you chose.'
	});
}

/** A notice sent by e-mail as well as under the bell (services/notices.ts). */
export function noticeMail({
	message,
	url,
	settingsUrl
}: {
	message: string;
	url: string;
	settingsUrl: string;
}): MailTemplate {
	return render({
		subject: 'News from Slotwise',
		greeting: 'Hello,',
		before: [message],
		actions: [{ label: 'Open it on Slotwise', url }],
		after: [`Choose which notices reach you by e-mail: ${settingsUrl}`],
		why: 'You got this e-mail because you asked for this kind of notice by e-mail in your Slotwise account settings.'
	});
}
