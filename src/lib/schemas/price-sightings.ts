import { z } from 'zod';
import { MAX_ID, isoDate, wholeNumberText } from './primitives';
import { pageNumber } from './query-params';

/*
 * Price sightings: what a signed-in user reports from a part page, and what editors post
 * when they verify or reject one. The amount stays text here: how many decimals it may have
 * depends on the region's currency and how the region writes decimals, which the service
 * looks up (domain/money.ts parseAmount).
 */

/** How far back a sighting may be dated. Common practice, no published source: older prices say little about today's. */
export const SIGHTING_MAX_AGE_DAYS = 90;
export const REJECT_REASON_MAX_CHARS = 500;
export const SIGHTINGS_PER_PAGE = 20;

const DAY_MS = 24 * 60 * 60 * 1000;

/** YYYY-MM-DD of the UTC day of `at`. */
export function utcDay(at: Date): string {
	return at.toISOString().slice(0, 10);
}

const emptyAsUndefined = (value: unknown) =>
	typeof value === 'string' && value.trim() === '' ? undefined : value;

const id = (what: string) => wholeNumberText(`Unknown ${what}.`, 1, MAX_ID);

const regionCode = z
	.string({ error: 'Choose a region.' })
	.trim()
	.toLowerCase()
	.regex(/^[a-z]{2,8}$/, 'Choose a region.');

const productLink = z
	.string({ error: 'Paste the link to the product page.' })
	.trim()
	.min(1, 'Paste the link to the product page.')
	.max(500, 'Use at most 500 characters for the link.')
	.refine((v) => {
		try {
			const url = new URL(v);
			return (url.protocol === 'https:' || url.protocol === 'http:') && url.hostname !== '';
		} catch {
			return false;
		}
	}, 'Enter a full web address starting with https:// or http://.');

/**
 * POST ?/reportPrice on a part page. `now` fixes "today" (UTC) for the date checks: a
 * sighting may be dated today or up to SIGHTING_MAX_AGE_DAYS days back.
 */
export function priceSightingInput(now: Date = new Date()) {
	const today = utcDay(now);
	const oldest = utcDay(new Date(now.getTime() - SIGHTING_MAX_AGE_DAYS * DAY_MS));
	return z.strictObject({
		regionCode,
		storeId: id('store'),
		price: z
			.string({ error: 'Enter the price you saw.' })
			.trim()
			.min(1, 'Enter the price you saw.')
			.max(20, 'That amount is too long.'),
		observedOn: isoDate({ missing: 'Enter the day you saw the price.' })
			.refine((d) => d <= today, 'The day cannot be in the future (dates are UTC).')
			.refine((d) => d >= oldest, `Report prices seen in the last ${SIGHTING_MAX_AGE_DAYS} days.`),
		url: productLink
	});
}
export type PriceSightingInput = z.infer<ReturnType<typeof priceSightingInput>>;

/** POST ?/verify on /editor/sightings. */
export const verifySightingInput = z.strictObject({ sightingId: id('sighting') });

/** POST ?/reject on /editor/sightings: the reason is shown to the people who reported it. */
export const rejectSightingInput = z.strictObject({
	sightingId: id('sighting'),
	reason: z
		.string({ error: 'Say why the sighting is rejected.' })
		.transform((v) => v.replace(/\r\n?/g, '\n').trim())
		.pipe(
			z
				.string()
				.min(3, 'Say why the sighting is rejected: the people who reported it see this reason.')
				.max(
					REJECT_REASON_MAX_CHARS,
					`Keep the reason to at most ${REJECT_REASON_MAX_CHARS} characters.`
				)
		)
});

/** GET /editor/sightings?page=&region=&q= */
export const pendingSightingsQuery = z.strictObject({
	page: pageNumber,
	region: z.preprocess(emptyAsUndefined, regionCode.optional()),
	q: z.string().trim().max(100, 'Search for at most 100 characters.').default('')
});
export type PendingSightingsQuery = z.infer<typeof pendingSightingsQuery>;
