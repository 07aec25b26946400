import { z } from 'zod';
import { PART_CATEGORIES } from '$lib/domain/types';
import type { FormReader } from './form-data';
import {
	amount,
	id,
	pastIsoDate,
	regionCode as regionCodeOf,
	slug,
	version,
	wholeNumber
} from './primitives';

/*
 * One schema per build operation, shared by the build page's form actions and the JSON API
 * (/api/v1/builds). Each schema is the JSON body; each `…Form` function reads the page's
 * posted form into that same shape (schemas/form-data.ts). Every object is strict: fields a
 * reader may not set (ownerId, shareToken, origin, sourceSlotKey) are refused, never silently
 * dropped. Every change carries the `version` the reader last saw.
 *
 * Amounts are text in the build region's currency ("699.99", or "699,99" where the region
 * writes the decimal comma); the service reads them with that currency's digits and names
 * the field when one does not fit.
 */

export const BUILD_VISIBILITY_VALUES = ['private', 'unlisted', 'public'] as const;

/** A non-negative amount as typed ("700", "699.99", "129,90" where the region writes the comma). */
export const buildAmount = amount();

/** A calendar date, YYYY-MM-DD, that exists and is not after today (UTC). */
export const pastDate = pastIsoDate();

const regionCode = regionCodeOf();
const storeName = z.string().trim().min(1, 'Name the store.').max(120, 'At most 120 characters.');
const quantity = wholeNumber('Enter a whole number from 1 to 16.', 1, 16);

/**
 * Build notes: at most 10,000 characters. The column is a MariaDB TEXT (65,535 bytes), and
 * 10,000 characters of four-byte UTF-8 still fit; the form used to allow 20,000, which did not.
 */
export const BUILD_NOTES_MAX = 10_000;

// ---------------------------------------------------------------------------------------------
// Settings: PATCH /api/v1/builds/[id] and the page's ?/settings
// ---------------------------------------------------------------------------------------------

export const updateBuildInput = z.strictObject({
	version,
	title: z
		.string()
		.trim()
		.min(1, 'Give the build a title.')
		.max(160, 'At most 160 characters.')
		.optional(),
	notes: z.string().max(BUILD_NOTES_MAX, 'At most 10,000 characters.').optional(),
	regionCode: regionCode.optional(),
	visibility: z
		.enum(BUILD_VISIBILITY_VALUES, { message: 'Choose private, unlisted or public.' })
		.optional(),
	/** null removes the budget. */
	budget: buildAmount.nullable().optional(),
	notifyOnNewRevision: z.boolean({ error: 'Send true or false.' }).optional()
});
export type UpdateBuildInput = z.infer<typeof updateBuildInput>;

/** The settings form: a blank budget removes it; the e-mail switch is a checkbox. */
export function updateBuildForm(f: FormReader) {
	return {
		version: f.number('version'),
		title: f.text('title'),
		notes: f.text('notes'),
		regionCode: f.text('regionCode'),
		visibility: f.text('visibility'),
		budget: f.textOrNull('budget'),
		notifyOnNewRevision: f.checkbox('notifyOnNewRevision')
	};
}

// ---------------------------------------------------------------------------------------------
// One slot: PATCH /api/v1/builds/[id]/slots/[slotId] and ?/swap, ?/quantity, ?/override, ?/purchase
// ---------------------------------------------------------------------------------------------

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
		partId: id('part').optional(),
		quantity: quantity.optional(),
		/** null removes the override. */
		priceOverride: priceOverrideInput.nullable().optional(),
		purchase: purchaseInput.optional()
	})
	.refine((v) => Object.entries(v).some(([k, value]) => k !== 'version' && value !== undefined), {
		message: 'Nothing to change.'
	});
export type UpdateSlotInput = z.infer<typeof updateSlotInput>;

/**
 * The page addresses a slot with a `slotId` field where the API has it in the path. Parsed
 * on its own, before the body, like the API's path.
 */
export const slotAddress = z.strictObject({ slotId: id('slot') });
export function slotAddressForm(f: FormReader) {
	return { slotId: f.number('slotId') };
}

/** The page's four slot forms, each one field of updateSlotInput. */
export const updateSlotForms = {
	/** A part button or select: `partId`. */
	swap: (f: FormReader) => ({ version: f.number('version'), partId: f.number('partId') }),
	quantity: (f: FormReader) => ({ version: f.number('version'), quantity: f.number('quantity') }),
	/** `amount`, `store`, `date`; the "back to the listed price" button posts `clear=1`. */
	override: (f: FormReader) => ({
		version: f.number('version'),
		priceOverride:
			f.text('clear') === '1'
				? null
				: { amount: f.text('amount'), store: f.text('store'), date: f.text('date') }
	}),
	/** `purchased` true/false; blank paid, date or store mean none. Un-marking sends nothing else. */
	purchase: (f: FormReader) => {
		const purchased = f.boolean('purchased');
		return {
			version: f.number('version'),
			purchase:
				purchased === true
					? {
							purchased,
							paid: f.textOrNull('paid'),
							purchasedAt: f.textOrNull('purchasedAt'),
							store: f.textOrNull('store')
						}
					: { purchased }
		};
	}
};

// ---------------------------------------------------------------------------------------------
// Add and remove slots: POST /api/v1/builds/[id]/slots, DELETE …/slots/[slotId]; ?/addSlot, ?/removeSlot
// ---------------------------------------------------------------------------------------------

export const addSlotInput = z.strictObject({
	version,
	category: z.enum(PART_CATEGORIES, { message: 'Choose a category.' }),
	label: z.string().trim().min(1, 'Give the slot a label.').max(80, 'At most 80 characters.'),
	partId: id('part'),
	quantity: quantity.default(1)
});
export type AddSlotInput = z.infer<typeof addSlotInput>;

export function addSlotForm(f: FormReader) {
	return {
		version: f.number('version'),
		category: f.text('category'),
		label: f.text('label'),
		partId: f.number('partId'),
		quantity: f.number('quantity')
	};
}

export const removeSlotInput = z.strictObject({ version });
export function versionForm(f: FormReader) {
	return { version: f.number('version') };
}

// ---------------------------------------------------------------------------------------------
// Fork: POST /api/v1/guides/[slug]/fork (the slug in the path) and the guide page's button
// ---------------------------------------------------------------------------------------------

/** The API's body must be empty or `{}`: the guide is the only input, in the path. */
export const FORK_TAKES_NO_FIELDS = 'Send an empty JSON object: a fork takes no fields.';

export const forkInput = z.strictObject(
	{ guide: slug('Unknown guide.') },
	{
		// About the body as a whole (not an object, or extra fields), never about `guide`.
		error: (issue) =>
			issue.code === 'unrecognized_keys' || issue.code === 'invalid_type'
				? FORK_TAKES_NO_FIELDS
				: undefined
	}
);

/** The guide page's fork button posts the guide's slug as `guide`. */
export function forkForm(f: FormReader) {
	return { guide: f.text('guide') };
}

// ---------------------------------------------------------------------------------------------
// Reading a build
// ---------------------------------------------------------------------------------------------

/** GET /api/v1/builds/[id] and the CSV export: ?key= (an unlisted build's link token, as on the page's link) and ?region=. */
export const buildQuery = z.strictObject({
	key: z
		.string()
		.regex(/^[A-Za-z0-9_-]{43}$/, 'Not a build link token.')
		.optional(),
	region: regionCode.optional()
});
export type BuildQuery = z.infer<typeof buildQuery>;

// ---------------------------------------------------------------------------------------------
// Deleting a build
// ---------------------------------------------------------------------------------------------

/** Deleting a build is for good: the page's form asks the owner to tick a confirmation first. */
export const deleteBuildInput = z.strictObject({
	confirm: z.literal('yes', {
		error: 'Tick the box to confirm: a deleted build cannot be restored.'
	})
});

/** The delete form posts its confirmation box as `confirm`. */
export function deleteBuildForm(f: FormReader) {
	return { confirm: f.text('confirm') };
}
