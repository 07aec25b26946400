import { greetingFor, render } from './templates.js';
import type { MailTemplate } from './templates.js';

/*
 * Tips (issue 20). Amounts arrive already formatted by formatMoney; the subject never carries
 * user input. No card details exist here to mention: the provider's page took the payment.
 */
interface TipMail {
	name: string;
	/** formatMoney() of the tip, e.g. "€5.00". */
	amount: string;
	guideTitle: string;
	/** The provider's reference for the payment, for questions. */
	reference: string;
}

/** To the reader, once the provider confirms the payment. */
export function tipReceipt({
	name,
	amount,
	guideTitle,
	authorName,
	reference,
	date,
	url
}: TipMail & { authorName: string; date: string; url: string }): MailTemplate {
	return render({
		subject: 'Your tip on Slotwise: receipt',
		greeting: greetingFor(name),
		before: [
			`Thank you for supporting ${authorName} for the guide "${guideTitle}".`,
			`Amount: ${amount}\nDate: ${date}\nPayment reference: ${reference}`,
			'The payment was taken by our payment provider; Slotwise never sees your card details.'
		],
		actions: [{ label: 'See your tip', url }],
		why: 'You got this e-mail because you tipped an author on Slotwise. If it was not you, reply to this e-mail so we can look into it.'
	});
}

/** To the author, once the provider confirms a reader's tip. */
export function tipReceived({
	name,
	amount,
	guideTitle,
	supporter,
	note,
	url
}: TipMail & { supporter: string; note: string | null; url: string }): MailTemplate {
	return render({
		subject: 'A reader tipped you on Slotwise',
		greeting: greetingFor(name),
		before: [
			`${supporter} tipped you ${amount} for your guide "${guideTitle}".`,
			...(note ? [`Their note: ${note}`] : [])
		],
		actions: [{ label: 'See your earnings', url }],
		why: 'You got this e-mail because you publish guides on Slotwise and take tips. You can turn tips off on your earnings page.'
	});
}

/** To the reader and to the author, after an admin refunded a tip. */
export function tipRefunded({
	name,
	amount,
	guideTitle,
	reference,
	forAuthor
}: TipMail & { forAuthor: boolean }): MailTemplate {
	return render({
		subject: 'A tip on Slotwise was refunded',
		greeting: greetingFor(name),
		before: [
			forAuthor
				? `A tip of ${amount} for your guide "${guideTitle}" was refunded to the reader. It no longer counts in your earnings.`
				: `Your tip of ${amount} for the guide "${guideTitle}" was refunded. The money goes back to the way you paid; banks usually take 5 to 10 days to show it.`,
			`Payment reference: ${reference}`
		],
		why: forAuthor
			? 'You got this e-mail because you take tips on Slotwise.'
			: 'You got this e-mail because you tipped an author on Slotwise.'
	});
}
