import { z } from 'zod';
import { SUBSCRIBER_AUDIENCES } from '$lib/domain/newsletter-audience';
import { emailAddress } from './email';
import { GUIDE_TAGS, type GuideTag } from './guide-editor';

/*
 * The newsletter's inputs: subscribe (footer and /newsletter), preferences (manage page and
 * account page), the one-click unsubscribe body, and an editor's mailing. One schema per
 * operation, shared by the form and any API; every object is strict.
 */

const regionCode = z
	.string()
	.trim()
	.toLowerCase()
	.regex(/^[a-z]{2,8}$/, 'Choose a region.');

/** A whole amount in the home region's currency ("1200"), or blank for no bound. */
const wholeAmount = z
	.string()
	.trim()
	.optional()
	.transform((s) => (s ? s : null))
	.refine(
		(s) => s === null || /^\d{1,7}$/.test(s),
		'Enter a whole amount like 1200, or leave it blank.'
	)
	.transform((s) => (s === null ? null : Number(s)));

const preferenceFields = {
	homeRegion: regionCode,
	regions: z.array(regionCode).max(20, 'Choose at most 20 regions.').default([]),
	budgetMin: wholeAmount,
	budgetMax: wholeAmount,
	tags: z
		.array(
			z.enum(GUIDE_TAGS as [GuideTag, ...GuideTag[]], { message: 'Choose tags from the list.' })
		)
		.max(GUIDE_TAGS.length)
		.default([]),
	audience: z
		.enum(SUBSCRIBER_AUDIENCES, { message: 'Choose which guides you want.' })
		.default('filters')
};

function budgetInOrder(p: { budgetMin: number | null; budgetMax: number | null }): boolean {
	return p.budgetMin === null || p.budgetMax === null || p.budgetMin <= p.budgetMax;
}
const budgetMessage = {
	message: 'The upper bound must not be below the lower one.',
	path: ['budgetMax']
};

export const newsletterPreferences = z
	.strictObject(preferenceFields)
	.refine(budgetInOrder, budgetMessage);
export type NewsletterPreferences = z.output<typeof newsletterPreferences>;

export const subscribeInput = z
	.strictObject({ email: emailAddress, ...preferenceFields })
	.refine(budgetInOrder, budgetMessage);
export type SubscribeInput = z.output<typeof subscribeInput>;

/** "Send me a fresh manage link": the address only. */
export const manageLinkInput = z.strictObject({ email: emailAddress });

/** RFC 8058 §3.1 (docs/sources.md 12): the one-click POST body is exactly this field. */
export const oneClickInput = z.strictObject({
	'List-Unsubscribe': z.literal('One-Click', { message: 'Not a one-click unsubscribe request.' })
});

export const tokenQuery = z.string().min(10).max(200);

const listFields = ['regions', 'tags'] as const;

/**
 * A newsletter form's fields as a plain object: `regions` and `tags` (checkboxes) as
 * arrays, everything else by its last value.
 */
export function newsletterFields(data: FormData): Record<string, string | string[]> {
	const out: Record<string, string | string[]> = {};
	for (const [key, value] of data) {
		if (typeof value !== 'string') continue;
		if ((listFields as readonly string[]).includes(key)) {
			const list = (out[key] as string[] | undefined) ?? [];
			list.push(value);
			out[key] = list;
		} else out[key] = value;
	}
	return out;
}

/** An editor's mailing: subject, intro and who gets it (defaults come from the guide). */
export const mailingInput = z.strictObject({
	subject: z
		.string()
		.trim()
		.min(3, 'Write a subject of at least 3 characters.')
		.max(150, 'Keep the subject to 150 characters.')
		// eslint-disable-next-line no-control-regex
		.refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'The subject must be one line.'),
	intro: z
		.string()
		.trim()
		.min(1, 'Write a short introduction.')
		.max(4000, 'Keep the introduction to 4000 characters.'),
	regions: z.array(regionCode).max(20).default([]),
	tags: z
		.array(
			z.enum(GUIDE_TAGS as [GuideTag, ...GuideTag[]], { message: 'Choose tags from the list.' })
		)
		.max(GUIDE_TAGS.length)
		.default([]),
	followers: z
		.literal('on')
		.optional()
		.transform((v) => v === 'on')
});
export type MailingInput = z.output<typeof mailingInput>;

/** The region a preview is priced in. */
export const previewRegionQuery = regionCode.optional().catch(undefined);

/** An editor starts a mailing for one approved revision. */
export const createMailingInput = z.strictObject({
	revisionId: z.coerce
		.number({ message: 'Choose a guide to mail.' })
		.int('Choose a guide to mail.')
		.positive('Choose a guide to mail.')
		.max(4_294_967_295, 'Choose a guide to mail.')
});
