import { z } from 'zod';
import { amountProblem, parseMajorAmount, tipLimits } from '../domain/tips.js';

/*
 * Tips (issue 20): the reader's tip form, the author's settings and an admin's refund. The
 * amount is either one of the presets (minor units, from the radio buttons) or "custom" with a
 * typed amount in major units; both end as `amountMinor` checked against the currency's limits.
 */
export const TIP_NOTE_MAX_CHARS = 280;
export const THANK_YOU_MAX_CHARS = 280;

const note = z
	.string()
	.transform((value) => value.replace(/\r\n?/g, '\n').trim())
	.pipe(z.string().max(TIP_NOTE_MAX_CHARS, `Keep the note to ${TIP_NOTE_MAX_CHARS} characters.`))
	.optional()
	.transform((value) => (value ? value : null));

const checkbox = z
	.enum(['on', 'true', '1'])
	.optional()
	.transform((value) => value !== undefined);

const optionalId = z
	.string()
	.regex(/^[1-9][0-9]{0,9}$/, 'Unknown build.')
	.optional()
	.or(z.literal('').transform(() => undefined))
	.transform((value) => (value ? Number(value) : null));

/** POST ?/default on /guides/[slug]/tip. */
export const tipInput = z
	.strictObject({
		currency: z
			.string({ error: 'Pick a currency.' })
			.regex(/^[A-Z]{3}$/, 'Pick a currency.')
			.refine((code) => tipLimits(code) !== null, 'Tips are not available in this currency.'),
		amount: z
			.string({ error: 'Pick an amount.' })
			.regex(/^(custom|[1-9][0-9]{0,9})$/, 'Pick an amount.'),
		customAmount: z.string().max(20, 'Enter an amount such as 5 or 7.50.').optional(),
		note,
		anonymous: checkbox,
		buildId: optionalId
	})
	.transform((input, ctx) => {
		let amountMinor: number;
		if (input.amount === 'custom') {
			const parsed = parseMajorAmount(input.customAmount ?? '', input.currency);
			if (!parsed.ok) {
				ctx.addIssue({ code: 'custom', path: ['customAmount'], message: parsed.message });
				return z.NEVER;
			}
			amountMinor = parsed.amountMinor;
		} else {
			amountMinor = Number(input.amount);
		}
		const problem = amountProblem(amountMinor, input.currency);
		if (problem) {
			const path = input.amount === 'custom' ? 'customAmount' : 'amount';
			ctx.addIssue({ code: 'custom', path: [path], message: problem });
			return z.NEVER;
		}
		return {
			currency: input.currency,
			amountMinor,
			note: input.note,
			anonymous: input.anonymous,
			buildId: input.buildId
		};
	});
export type TipInput = z.output<typeof tipInput>;

/**
 * POST ?/settings on /my/earnings. The message is required although it may be empty: the
 * form's textarea always posts it, and a body without it (empty, or only fields the form
 * reader drops) would otherwise read as "tips off, no message" and erase both.
 */
export const tipSettingsInput = z.strictObject({
	tipsEnabled: checkbox,
	thankYouMessage: z
		.string({ error: 'Send the tip settings from their form.' })
		.transform((value) => value.replace(/\r\n?/g, '\n').trim())
		.pipe(
			z.string().max(THANK_YOU_MAX_CHARS, `Keep the message to ${THANK_YOU_MAX_CHARS} characters.`)
		)
});
export type TipSettingsInput = z.output<typeof tipSettingsInput>;

/** POST ?/refund on /admin/tips. */
export const refundInput = z.strictObject({
	tipId: z
		.string({ error: 'Unknown payment.' })
		.regex(/^[1-9][0-9]{0,9}$/, 'Unknown payment.')
		.transform(Number)
});

/** The provider's session id on the return from its pay page. */
export const checkoutReturnQuery = z.strictObject({
	session_id: z.string().regex(/^cs_[A-Za-z0-9_]{1,250}$/, 'Unknown checkout session.')
});
