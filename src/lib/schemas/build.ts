import { z } from 'zod';
import { PART_CATEGORIES } from '$lib/domain/types';
import { amount, pastIsoDate, regionCode as regionCodeOf, version } from './primitives';

/*
 * Input of the build editor (pages and the JSON API share it). Every object is strict:
 * fields a reader may not set (ownerId, shareToken, origin, sourceSlotKey) are refused,
 * never silently dropped. Every change carries the `version` the reader last saw.
 * Amounts are decimal strings in the build region's currency; the service converts them
 * with that currency's digits (a third decimal in EUR is refused there, by field).
 */

export const BUILD_VISIBILITY_VALUES = ['private', 'unlisted', 'public'] as const;

/** A non-negative amount as typed ("700", "699.99", "129,90" where the region writes the comma). */
export const buildAmount = amount();

/** A calendar date, YYYY-MM-DD, that exists and is not after today (UTC). */
export const pastDate = pastIsoDate();

const storeName = z.string().trim().min(1, 'Name the store.').max(120, 'At most 120 characters.');

const regionCode = regionCodeOf();

export const updateBuildInput = z.strictObject({
	version,
	title: z
		.string()
		.trim()
		.min(1, 'Give the build a title.')
		.max(160, 'At most 160 characters.')
		.optional(),
	notes: z.string().max(10_000, 'At most 10,000 characters.').optional(),
	regionCode: regionCode.optional(),
	visibility: z
		.enum(BUILD_VISIBILITY_VALUES, { message: 'Choose private, unlisted or public.' })
		.optional(),
	/** null removes the budget. */
	budget: buildAmount.nullable().optional(),
	notifyOnNewRevision: z.boolean().optional()
});
export type UpdateBuildInput = z.infer<typeof updateBuildInput>;

export const priceOverrideInput = z.strictObject({
	amount: buildAmount,
	store: storeName,
	date: pastDate
});

export const purchaseInput = z.strictObject({
	purchased: z.boolean({ message: 'Say whether the part is bought.' }),
	/** What was paid for the whole line, in the region's currency; null or absent: the line total counts. */
	paid: buildAmount.nullish(),
	purchasedAt: pastDate.nullish(),
	store: z.string().trim().max(120, 'At most 120 characters.').nullish()
});

export const updateSlotInput = z
	.strictObject({
		version,
		partId: z.number().int().positive('Choose a part.').optional(),
		quantity: z.number().int().min(1, 'At least 1.').max(16, 'At most 16.').optional(),
		/** null removes the override. */
		priceOverride: priceOverrideInput.nullable().optional(),
		purchase: purchaseInput.optional()
	})
	.refine((v) => Object.keys(v).some((k) => k !== 'version'), { message: 'Nothing to change.' });
export type UpdateSlotInput = z.infer<typeof updateSlotInput>;

export const addSlotInput = z.strictObject({
	version,
	category: z.enum(PART_CATEGORIES, { message: 'Choose a category.' }),
	label: z.string().trim().min(1, 'Give the slot a label.').max(80, 'At most 80 characters.'),
	partId: z.number().int().positive('Choose a part.'),
	quantity: z.number().int().min(1, 'At least 1.').max(16, 'At most 16.').default(1)
});
export type AddSlotInput = z.infer<typeof addSlotInput>;

export const removeSlotInput = z.strictObject({ version });

/** GET /api/v1/builds/[id] and the CSV export: ?key= (an unlisted build's link token, as on the page's link) and ?region=. */
export const buildQuery = z.strictObject({
	key: z
		.string()
		.regex(/^[A-Za-z0-9_-]{43}$/, 'Not a build link token.')
		.optional(),
	region: regionCode.optional()
});
export type BuildQuery = z.infer<typeof buildQuery>;
