import { z } from 'zod';

/*
 * The build page's form posts, parsed into the shapes services/build-edits.ts takes. Every form
 * carries the build's `version` (optimistic locking) and, for slot edits, the slot id.
 * Amounts stay decimal text here: the service checks them against the region's currency.
 */

const id = (what: string) =>
	z.coerce
		.number({ error: `Unknown ${what}.` })
		.int(`Unknown ${what}.`)
		.positive(`Unknown ${what}.`);
const version = z.coerce
	.number({ error: 'Reload the page: the form is missing its version.' })
	.int()
	.min(1);
const amount = z
	.string()
	.trim()
	.regex(/^\d{1,9}(\.\d{1,3})?$/, 'Write an amount like 129.99.');
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Pick a date.');
const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);

export const slotForm = z.object({ slotId: id('slot'), version });

export const swapForm = slotForm.extend({ partId: id('part') });

export const quantityForm = slotForm.extend({
	quantity: z.coerce
		.number({ error: 'Write a whole number.' })
		.int('Write a whole number.')
		.min(1, 'At least 1.')
		.max(16, 'At most 16.')
});

export const overrideForm = z.union([
	slotForm
		.extend({ clear: z.literal('1') })
		.transform(({ slotId, version }) => ({ slotId, version, priceOverride: null })),
	slotForm
		.extend({ amount, store: z.string().trim().min(1, 'Name the store.').max(120), date: day })
		.transform(({ slotId, version, amount, store, date }) => ({
			slotId,
			version,
			priceOverride: { amount, store, date }
		}))
]);

export const purchaseForm = slotForm
	.extend({
		purchased: z.enum(['true', 'false']).transform((v) => v === 'true'),
		paid: z.preprocess(blankToNull, amount.nullable()).default(null),
		purchasedAt: z.preprocess(blankToNull, day.nullable()).default(null),
		store: z.preprocess(blankToNull, z.string().trim().max(120).nullable()).default(null)
	})
	.transform(({ slotId, version, purchased, paid, purchasedAt, store }) => ({
		slotId,
		version,
		purchase: purchased
			? { purchased, paid, purchasedAt, store }
			: { purchased, paid: null, purchasedAt: null, store: null }
	}));

export const addSlotForm = z.object({
	version,
	category: z.string().min(1, 'Choose a category.'),
	label: z.string().trim().min(1, 'Give the slot a label.').max(80),
	partId: id('part'),
	quantity: z.coerce.number().int().min(1).max(16).default(1)
});

export const settingsForm = z.object({
	version,
	title: z.string().trim().min(1, 'Give the build a title.').max(160),
	notes: z.string().max(20_000, 'Keep notes under 20,000 characters.').default(''),
	regionCode: z.string().trim().min(2).max(8),
	visibility: z.enum(['private', 'unlisted', 'public'], { error: 'Choose who can see the build.' }),
	budget: z.preprocess(blankToNull, amount.nullable()).default(null),
	notifyOnNewRevision: z.preprocess((v) => v === 'on' || v === 'true', z.boolean())
});

export const versionForm = z.object({ version });

/** The sync table: `choice:<row id>` radios, an optional "take every non-conflicting change" button. */
export const syncForm = z.preprocess(
	(data) => {
		const form = data as FormData;
		const choices: Record<string, string> = {};
		for (const [key, value] of form)
			if (key.startsWith('choice:') && typeof value === 'string') choices[key.slice(7)] = value;
		return {
			version: form.get('version'),
			upstreamRevisionId: form.get('upstreamRevisionId') ?? undefined,
			takeAllNonConflicting: form.get('takeAll') === '1',
			choices
		};
	},
	z.object({
		version,
		upstreamRevisionId: z.coerce.number().int().positive().optional(),
		takeAllNonConflicting: z.boolean(),
		choices: z.record(
			z.string().max(200),
			z.enum(['take_upstream', 'keep_local'], { error: 'Choose to take the change or keep yours.' })
		)
	})
);

export const proposeBudgetForm = z.object({ budget: amount });

export const applyBudgetForm = z.object({
	version,
	budgetMinor: z.coerce.number().int().min(0).max(Number.MAX_SAFE_INTEGER)
});
