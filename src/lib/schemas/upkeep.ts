import { z } from 'zod';
import { MAX_ID, slug, wholeNumber } from './primitives.js';

/*
 * The author's answers to an upkeep alert and their upkeep settings, shared by the
 * dashboard's form actions.
 * A form posts text; schemas/form-data.ts reads the alert id and days into numbers first.
 */

export const SNOOZE_DAYS = [7, 30] as const;

export const snoozeAlertInput = z.strictObject({
	alertId: wholeNumber('Choose an alert.', 1, MAX_ID),
	days: z.union([z.literal(7), z.literal(30)], { error: 'Snooze for 7 or 30 days.' })
});
export type SnoozeAlertInput = z.infer<typeof snoozeAlertInput>;

export const handleAlertInput = z.strictObject({
	alertId: wholeNumber('Choose an alert.', 1, MAX_ID)
});
export type HandleAlertInput = z.infer<typeof handleAlertInput>;

export const upkeepDigestInput = z.strictObject({ enabled: z.boolean() });

/** How far a guide's total may move in a region, in whole percent, before an alert. */
export const upkeepThresholdInput = z.strictObject({
	percent: wholeNumber('Enter a whole percentage from 1 to 50.', 1, 50)
});
export type UpkeepThresholdInput = z.infer<typeof upkeepThresholdInput>;

/** The editor's query when opened from an insights suggestion (`?slot=<key>&alternate=<part slug>`). */
export const suggestedAlternateQuery = z.object({
	slot: z.string().trim().min(1).max(64),
	alternate: slug('Choose a part.')
});
